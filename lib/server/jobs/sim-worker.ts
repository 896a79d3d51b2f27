/**
 * The worker-thread side of the pool: one task is one chunk of simulations. It needs nothing from piscina
 * (a plain module, easy to compile or bundle on its own); the curves come back by structured clone, a few
 * megabytes per run at most. An input error is returned as data, because an Error crossing the thread
 * boundary loses its class.
 */
import { runSimChunk, SpatialInputError, type SimChunk } from "../../spatial";

export default function simulateChunk(chunk: SimChunk): Float64Array | { inputError: string } {
  try {
    return runSimChunk(chunk).curves;
  } catch (error) {
    if (error instanceof SpatialInputError) return { inputError: error.message };
    throw error;
  }
}
