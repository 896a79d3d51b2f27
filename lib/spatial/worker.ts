/**
 * The worker-thread side of the pool: one task is one chunk of simulations. The curves' buffer is moved,
 * not copied, back to the main thread. An input error is returned as data, because an Error crossing the
 * thread boundary loses its class.
 */
import { move } from "piscina";
import { SpatialInputError } from "./errors";
import { runSimChunk } from "./sim-chunk";
import type { SimChunk } from "./sim-models";

export default function simulateChunk(chunk: SimChunk): Float64Array | { inputError: string } {
  try {
    return move(runSimChunk(chunk).curves) as unknown as Float64Array;
  } catch (error) {
    if (error instanceof SpatialInputError) return { inputError: error.message };
    throw error;
  }
}
