/**
 * `npm run bench [-- NAME ...]`: runs every scripts/bench-*.ts (or only bench-NAME.ts), one child process
 * each so that one benchmark's memory and JIT state do not colour the next. Arguments after the names
 * are passed through (e.g. `npm run bench -- spatial --quick`); `npm run bench -- --list` names them all.
 * The only way to start a benchmark: each child gets the same Node options, among them the server
 * condition that server modules (the register benchmark's route handlers) need to load outside Next.
 */
import { spawnSync } from "node:child_process";
import { readdirSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

/** `react-server`: "server-only" resolves to its empty module, as it does inside Next's server bundle. */
const NODE_OPTIONS = ["--conditions=react-server", "--import", "tsx"];
const here = dirname(fileURLToPath(import.meta.url));
const available = readdirSync(here)
  .filter((f) => /^bench-.+\.ts$/.test(f))
  .map((f) => f.slice(6, -3))
  .sort();
const args = process.argv.slice(2);
if (args.includes("--list")) {
  // What `npm run bench` runs, and how each starts, without running any of them.
  for (const name of available) console.log(`${name}\tnode ${NODE_OPTIONS.join(" ")} scripts/bench-${name}.ts`);
  process.exit(0);
}
const names = args.filter((a) => !a.startsWith("--"));
const passThrough = args.filter((a) => a.startsWith("--"));
const chosen = names.length ? names : available;
for (const name of chosen) {
  if (!available.includes(name)) {
    console.error(`No benchmark "${name}"; available: ${available.join(", ")}`);
    process.exit(2);
  }
  const script = join(here, `bench-${name}.ts`);
  const run = spawnSync(process.execPath, [...NODE_OPTIONS, script, ...passThrough], { stdio: "inherit" });
  if (run.status !== 0) process.exit(run.status ?? 1);
}
