import "server-only";
import path from "node:path";
import { createSimulationPool, type SimulationPool } from "@/lib/spatial/pool";

/**
 * The engine's worker-thread pool of this process, created once. The worker file is named by its path in
 * the source tree: a Next.js server bundles this module, so the engine's own `import.meta.url` default
 * would point inside the bundle, where the worker entry does not exist.
 */
const holder = ((globalThis as Record<string, unknown>).__loamworkSimPool ??= {}) as { pool?: SimulationPool };

export function simulationPool(): SimulationPool {
  holder.pool ??= createSimulationPool({ workerFile: path.join(process.cwd(), "lib", "spatial", "worker-entry.mjs") });
  return holder.pool;
}

export async function closeSimulationPool(): Promise<void> {
  const pool = holder.pool;
  holder.pool = undefined;
  if (pool) await pool.destroy();
}
