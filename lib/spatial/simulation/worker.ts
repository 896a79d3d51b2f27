/**
 * The worker-thread side of the pool: one task is one chunk of simulations. It needs nothing from piscina
 * (a plain module, easy to compile or bundle on its own); the curves come back by structured clone, a few
 * megabytes per run at most. An input error is returned as data, because an Error crossing the thread
 * boundary loses its class.
 */
import { SpatialInputError } from "../errors";
import { runSimChunk } from "./sim-chunk";
import type { SimChunk } from "./sim-models";

export default function simulateChunk(chunk: SimChunk): Float64Array | { inputError: string } {
  try {
    return runSimChunk(chunk).curves;
  } catch (error) {
    if (error instanceof SpatialInputError) return { inputError: error.message };
    throw error;
  }
}
