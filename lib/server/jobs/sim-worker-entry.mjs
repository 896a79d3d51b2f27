// Entry file of the simulation worker threads. Worker threads start without the TypeScript loader of
// the parent (vitest, tsx or a Next.js server), so the entry registers tsx's ESM hooks in this thread and
// then imports the TypeScript worker. A deployment that compiles the worker to JavaScript can point the
// pool at the compiled sim-worker.js instead (createSimulationPool({ workerFile })).
import { register } from "tsx/esm/api";

register();
const mod = await import("./sim-worker.ts");
export default mod.default;
