/**
 * A find's reduced level against its context's recorded top and base (issue 13, "Context sheets"): a find
 * above the top or below the base by more than the tolerance gets a warning, never a refusal: the top and
 * base are spot levels, and a find can sit in a dip between them. Null when the level fits or is unknown.
 */
export function levelOutsideContext(
  z: number | null,
  range: { top: number | null; base: number | null } | undefined,
  tolerance: number,
  contextNumber: number,
): string | null {
  if (z === null || !range) return null;
  const mm = (v: number) => `${Math.round(v * 1000)} mm`;
  if (range.top !== null && z > range.top + tolerance) {
    return `RL ${z.toFixed(3)} lies ${mm(z - range.top)} above the recorded top of context ${contextNumber} (${range.top.toFixed(3)})`;
  }
  if (range.base !== null && z < range.base - tolerance) {
    return `RL ${z.toFixed(3)} lies ${mm(range.base - z)} below the recorded base of context ${contextNumber} (${range.base.toFixed(3)})`;
  }
  return null;
}

/** A depth below a surface as a reduced level: RL = surface RL − depth. */
export function depthToLevel(surfaceLevel: number, depth: number): number {
  return Math.round((surfaceLevel - depth) * 1e6) / 1e6;
}
