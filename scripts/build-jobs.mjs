/**
 * The second half of `npm run build` (after `next build`): compiles the entry points that run outside Next's
 * own bundle into plain JavaScript in dist/, so a deployment runs them with Node alone, without the dev tools
 * (tsx, TypeScript) that development uses to run them from source:
 *   dist/sim-worker-entry.mjs  the simulation worker threads (piscina), for the server and the run worker;
 *   dist/worker.mjs            `npm run worker`, the pg-boss run worker for PostgreSQL deployments;
 *   dist/seed-demo.mjs         `npm run seed`, the demo site;
 *   dist/backup.mjs            `npm run backup -- FILE`, the database and files store in one archive;
 *   dist/restore.mjs           `npm run restore -- FILE`, that archive back into a fresh install.
 * Packages stay outside the bundles (they are the production dependencies, installed beside them), except
 * "server-only", whose guard means nothing outside a React bundle.
 */
import { rmSync } from "node:fs";
import { build } from "esbuild";

const serverOnly = {
  name: "server-only",
  setup(b) {
    b.onResolve({ filter: /^server-only$/ }, () => ({ path: "server-only", namespace: "empty" }));
    b.onLoad({ filter: /.*/, namespace: "empty" }, () => ({ contents: "", loader: "js" }));
  },
};

rmSync("dist", { recursive: true, force: true });
await build({
  entryPoints: {
    "sim-worker-entry": "lib/server/jobs/sim-worker.ts",
    worker: "scripts/worker.ts",
    "seed-demo": "scripts/seed-demo.ts",
    backup: "scripts/backup.ts",
    restore: "scripts/restore.ts",
  },
  outdir: "dist",
  outExtension: { ".js": ".mjs" },
  bundle: true,
  splitting: true,
  format: "esm",
  platform: "node",
  target: "node20",
  packages: "external",
  plugins: [serverOnly],
  sourcemap: true,
  logLevel: "warning",
});
console.log("Compiled the run worker, the simulation threads, the seed, backup and restore into dist/.");
