import "server-only";
import { existsSync } from "node:fs";
import path from "node:path";
import { env } from "@/lib/env";
import { createRandom, runDistributionTest, type SimulationPool } from "@/lib/spatial";
import { createSimulationPool } from "./thread-pool";
import { processSingleton } from "@/lib/process-singleton";

/**
 * The engine's worker-thread pool of this process, created once. The worker file is named by its path in
 * the project: a Next.js server bundles this module, so the pool's own `import.meta.url` default would point
 * inside the bundle, where the worker entry does not exist. A production server (`next start`) runs the
 * threads from the JavaScript `npm run build` compiled into dist/; development and tests run the
 * TypeScript entry through tsx.
 *
 * Why development keeps tsx rather than one compiled worker: the engine's source changes between runs there,
 * so a compiled copy would need a staleness check and a rebuild at every pool start, written atomically
 * because vitest starts several processes at once; tsx is already what development and the scripts run
 * under, so the fallback adds no dependency; and NODE_ENV=production never reaches it (dist/ or a clear
 * error), which scripts/check-production.sh proves with dev dependencies pruned.
 */
const holder = processSingleton<{ pool?: SimulationPool; warm?: Promise<void> }>("simulation-pool", () => ({}));

function workerFile(): string {
  if (env().NODE_ENV !== "production") return path.join(process.cwd(), "lib", "server", "jobs", "sim-worker-entry.mjs");
  const compiled = path.join(process.cwd(), "dist", "sim-worker-entry.mjs");
  if (!existsSync(compiled))
    throw new Error(`The simulation worker ${compiled} is missing: build with \`npm run build\`.`);
  return compiled;
}

export function simulationPool(): SimulationPool {
  holder.pool ??= createSimulationPool({ workerFile: workerFile() });
  return holder.pool;
}

/**
 * Readies the pool before anyone presses Run: each worker thread loads the engine (compiling its
 * TypeScript on the way) and simulates a few small patterns, so the first real run does not pay for
 * thread start and a cold JIT. Runs once per pool, in the background; a failure is only logged, since a
 * real run reports its own. A run submitted meanwhile waits at most for these few small tasks.
 */
export function warmSimulationPool(pool: SimulationPool = simulationPool()): Promise<void> {
  if (pool === holder.pool && holder.warm) return holder.warm;
  const rng = createRandom(7);
  const points = Array.from({ length: 200 }, () => ({ x: 10 * rng.next(), y: 6 * rng.next() }));
  const spec = {
    window: {
      outer: [
        [0, 0],
        [10, 0],
        [10, 6],
        [0, 6],
      ] as [number, number][],
    },
    points,
    seed: 1,
    nsim: Math.max(19, 8 * pool.threads * 2),
    r: { max: 1.5, count: 33 },
    tests: [
      {
        type: "l-envelope" as const,
        count: "fixed" as const,
        correction: "isotropic" as const,
        statistic: "mad" as const,
      },
    ],
  };
  const warm = runDistributionTest(spec, { pool }).then(
    () => undefined,
    (err) => console.error("[loamwork] warming the simulation threads failed; runs will start them", err),
  );
  if (pool === holder.pool) holder.warm = warm;
  return warm;
}

export async function closeSimulationPool(): Promise<void> {
  const pool = holder.pool;
  holder.pool = undefined;
  holder.warm = undefined;
  if (pool) await pool.destroy();
}
