import { defineConfig } from "vitest/config";
import path from "node:path";

export default defineConfig({
  resolve: {
    alias: {
      "@": path.resolve(import.meta.dirname),
      "server-only": path.resolve(import.meta.dirname, "tests/support/server-only-stub.ts"),
    },
  },
  test: {
    include: ["lib/**/*.test.ts", "tests/**/*.test.ts"],
    exclude: ["tests/e2e/**", "node_modules/**"],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: "forks",
    setupFiles: ["tests/support/per-file-setup.ts"],
    env: { LOAMWORK_DATA_DIR: "memory", NODE_ENV: "test" },
    // next-auth imports "next/server" without an extension, which plain Node ESM cannot resolve.
    server: { deps: { inline: ["next-auth"] } },
  },
});
