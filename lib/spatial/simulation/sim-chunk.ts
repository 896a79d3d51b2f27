/**
 * Run a chunk of simulations: the same function runs inside a worker thread and, when no pool is used, in
 * the calling thread, so numbers never depend on where they were computed. Prepared models are kept per
 * setup key (a worker sees many chunks of one test).
 */
import { SpatialInputError } from "../errors";
import { createRandom } from "../random/random";
import { prepareClasses } from "./sim-classes";
import { prepareCsr, type PreparedModel } from "./sim-csr";
import { prepareInhom } from "./sim-inhom";
import type { SimChunk, SimChunkResult, SimSetup } from "./sim-models";
import { createWindow } from "../geometry/window";

const cache = new Map<string, PreparedModel>();
const CACHE_LIMIT = 4;

export function prepareModel(setup: SimSetup): PreparedModel {
  const window = createWindow(setup.window);
  const r = Float64Array.from(setup.r);
  const model = setup.model;
  switch (model.kind) {
    case "csr-l":
    case "csr-nn":
    case "csr-g":
      return prepareCsr(window, r, model);
    case "labelling":
    case "fixed-a":
      return prepareClasses(window, r, model);
    case "inhom-l":
      return prepareInhom(window, r, model.lambda);
    default:
      throw new SpatialInputError(`Unknown simulation model "${(model as { kind: string }).kind}".`);
  }
}

function cachedModel(chunk: SimChunk): PreparedModel {
  let prepared = cache.get(chunk.key);
  if (!prepared) {
    prepared = prepareModel(chunk.setup);
    if (cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value as string);
    cache.set(chunk.key, prepared);
  }
  return prepared;
}

/** Simulations chunk.from .. chunk.to − 1. `shouldStop` is polled between simulations. */
export function runSimChunk(chunk: SimChunk, shouldStop?: () => boolean): SimChunkResult {
  const prepared = cachedModel(chunk);
  const { m } = prepared;
  const count = chunk.to - chunk.from;
  const curves = new Float64Array(count * m);
  for (let s = 0; s < count; s++) {
    if (shouldStop?.()) throw new DOMException("The simulation run was cancelled.", "AbortError");
    const rng = createRandom(chunk.seed, chunk.streamBase + chunk.from + s);
    prepared.simulate(rng, curves, s * m);
  }
  return { from: chunk.from, to: chunk.to, m, curves };
}
