/** Curve tests that need the kernel estimators: pair correlation and the inhomogeneous L. */
import { SpatialInputError } from "./errors";
import type { RunContext } from "./run-context";
import type { EnvelopeOutcome } from "./run-envelope";
import type { TestSpec } from "./run-spec";

export async function extraCurveTest(ctx: RunContext, t: Extract<TestSpec, { type: "pcf-envelope" | "inhomogeneous-l" }>): Promise<EnvelopeOutcome> {
  void ctx;
  throw new SpatialInputError(`The ${t.type} test is not available in this engine build yet.`);
}
