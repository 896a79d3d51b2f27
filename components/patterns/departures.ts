import type { Departure } from "@/lib/patterns-view/test-view";
import { fmtM } from "./words";

/**
 * The stretches worth naming: a curve that grazes the band for a few grid steps (pointwise noise, expected
 * somewhere along any curve) is summarised as a count, not listed. Widest first, at most three.
 */
export function mainDepartures(deps: Departure[], rmax: number): { shown: Departure[]; minor: number } {
  const wide = deps.filter((d) => d.to - d.from >= rmax / 20);
  const shown = [...wide]
    .sort((a, b) => b.to - b.from - (a.to - a.from))
    .slice(0, 3)
    .sort((a, b) => a.from - b.from);
  return { shown, minor: deps.length - shown.length };
}

/** Where the curve leaves the band and rejoins it, in words, with what it suggests about cluster size. */
export function departureSentences(deps: Departure[], rmax: number, kind: "l" | "cross", significant = true): string[] {
  if (!deps.length) return [`The observed curve stays inside the pointwise band over the whole range 0–${fmtM(rmax)}.`];
  const { shown, minor } = mainDepartures(deps, rmax);
  if (!significant) {
    // Without a global rejection a crossing of the pointwise band is expected somewhere; no size is read from it.
    const where = shown.map((d) => `${fmtM(d.from)}–${fmtM(d.to)}`).join(", ");
    return [
      `The curve crosses the pointwise band ${deps.length === 1 ? "once" : `${deps.length} times`}${where ? ` (widest: ${where})` : ""}, but the global test finds no evidence: such crossings happen by chance, so no cluster size should be read from them.`,
    ];
  }
  const lines = shown.map((d) => {
    const span = d.rejoins
      ? `from r = ${fmtM(d.from)} and rejoins it at ${fmtM(d.to)}`
      : `from r = ${fmtM(d.from)} and does not rejoin it before r max (${fmtM(rmax)})`;
    if (d.side === "above") {
      const size = d.rejoins
        ? kind === "l"
          ? ` That suggests clusters up to roughly ${fmtM(d.to)} across — a rough reading that tends to overstate the size.`
          : ` The two classes are found together within about ${fmtM(d.to)} of each other (a rough reading that tends to overstate).`
        : " The clusters may be larger than the range studied; widen r max to see where the curve comes back.";
      return `The curve leaves the band above ${span}.${size}`;
    }
    return `The curve leaves the band below ${span}: fewer neighbours than chance at these distances${kind === "l" ? ", as when finds keep a spacing from each other" : ", the classes keep apart"}.`;
  });
  if (minor)
    lines.push(
      `${minor} brief crossing${minor > 1 ? "s" : ""} of the band elsewhere — pointwise noise of the kind the global test allows for.`,
    );
  return lines;
}
