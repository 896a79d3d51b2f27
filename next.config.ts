import type { NextConfig } from "next";

const config: NextConfig = {
  // PGlite opens its own files at run time; keep it out of the bundle (local-services.md).
  serverExternalPackages: ["@electric-sql/pglite", "piscina", "sharp", "smtp-server", "mailparser", "nodemailer", "pg-boss"],
  experimental: { authInterrupts: true },
  poweredByHeader: false,
  // Types are checked by `npm run typecheck` in the test command, once for the whole tree.
  typescript: { ignoreBuildErrors: true },
};

export default config;
