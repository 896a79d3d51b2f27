/**
 * The one error class of the engine. Its message names the problem in words a finds specialist can act on
 * ("point 12 (4.20, 7.95) lies outside the trench"); callers show it as is.
 */
export class SpatialInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "SpatialInputError";
  }
}

/** Throw a SpatialInputError unless the condition holds. */
export function assertInput(condition: unknown, message: string): asserts condition {
  if (!condition) throw new SpatialInputError(message);
}
