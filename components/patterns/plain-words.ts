/**
 * A run's answers in words a digger can repeat: one sentence per class and per pair of classes, and the
 * badge words. They keep the hedges of statistics.md: with few finds they say "too few to tell" (never
 * "random"), a cluster size is "roughly" (read from where the L curve rejoins its band, which tends to
 * overstate), and "no clear pattern" is not a claim that the finds lie at random.
 */
import type { ClassInScope } from "@/lib/api/run-result";
import type { SquareTestView } from "@/lib/patterns-view/square-view";
import type { CrossView, Departure, TestView } from "@/lib/patterns-view/test-view";
import { mainDepartures } from "./departures";

/** statistics.md: fewer than about 20 points gives little power (the server's LOW_POWER_N). */
export const LOW_POWER_N = 20;

/** A distance for a sentence: two significant figures, "1.5 m", "0.35 m". */
const metres = (v: number) => `${Number(v.toPrecision(2))} m`;

/** The badge on a test's card: the answer in plain words. */
export function badgeWords(t: TestView): string {
  switch (t.verdict) {
    case "clustered":
      return t.kind === "k-difference" ? "One class more grouped" : "Grouped together";
    case "regular":
      return "Evenly spread";
    case "associated":
      return "Found together";
    case "segregated":
      return "Kept apart";
    case "no-evidence":
      return fewIn(t) ? "Too few to tell" : "No clear pattern";
  }
}

/** Too few finds for a "no clear pattern" to mean much (statistics.md: under about 20, little power). */
function fewIn(t: TestView): boolean {
  return "nA" in t ? Math.min(t.nA, t.nB) < LOW_POWER_N : t.n < LOW_POWER_N;
}

/** The engine's sentence without its p-value: p is shown once per result, beside the badge. */
export function withoutP(sentence: string): string {
  return sentence.replace(/\s*\(p\s*[=<]\s*[^)]*\)/g, "");
}

/** The widest stretch above the band that rejoins it: where a rough group size can be read. */
function groupSize(deps: Departure[], rmax: number): number | null {
  const above = mainDepartures(deps, rmax).shown.find((d) => d.side === "above" && d.rejoins);
  return above ? above.to : null;
}

/** The tests that look at one class on its own, strongest first: global envelope tests, then the rest. */
const ORDER: TestView["kind"][] = ["l-envelope", "pcf-envelope", "inhomogeneous-l", "clark-evans", "quadrat"];

/** One sentence for a class, from all the tests run on it. */
export function classSentence(c: ClassInScope, tests: TestView[], rmax: number): string {
  const who = `${c.label} (${c.code}) finds`;
  const own = tests
    .filter((t) => "classId" in t && t.classId === c.id)
    .sort((a, b) => ORDER.indexOf(a.kind) - ORDER.indexOf(b.kind));
  if (!own.length) return `${who}: no test was run on them.`;
  const grouped = own.filter((t) => t.verdict === "clustered");
  const even = own.filter((t) => t.verdict === "regular");
  if (grouped.length && even.length)
    return `${who}: the tests disagree (some find them grouped, some evenly spread); read the details before quoting either.`;
  if (grouped.length) {
    const l = grouped.find((t) => t.kind === "l-envelope");
    const size = l && l.kind === "l-envelope" ? groupSize(l.departures, rmax) : null;
    const inhomOnly = grouped.every((t) => t.kind === "inhomogeneous-l");
    if (inhomOnly) return `${who} lie in groups, more than the general spread of finds over the trench would explain.`;
    return size !== null
      ? `${who} lie in groups, roughly up to ${metres(size)} across.`
      : `${who} lie in groups, closer together than chance would give.`;
  }
  if (even.length) return `${who} are spread more evenly than chance would give, as if kept apart from each other.`;
  if (c.n < LOW_POWER_N)
    return `${who}: too few to tell (${c.n}); with under ${LOW_POWER_N} finds a pattern could easily be missed.`;
  return `${who} show no clear pattern: chance alone could have laid them out like this.`;
}

/** One sentence for a pair of classes, from a cross-L or K-difference test. */
export function pairSentence(t: CrossView, name: (id: string) => string, rmax: number): string {
  const a = name(t.a);
  const b = name(t.b);
  switch (t.verdict) {
    case "associated": {
      const size = groupSize(t.departures, rmax);
      return size !== null
        ? `${a} and ${b} are found near each other more than chance would give, within roughly ${metres(size)}.`
        : `${a} and ${b} are found near each other more than chance would give.`;
    }
    case "segregated":
      return `${a} and ${b} keep apart: fewer of them lie near each other than chance would give.`;
    case "clustered": {
      // K_AA − K_BB above its band: the first class is the more grouped one; below: the second.
      const main = mainDepartures(t.departures, rmax).shown[0];
      if (!main) return `One of ${a} and ${b} is more tightly grouped than the other; see the details.`;
      const [more, less] = main.side === "above" ? [a, b] : [b, a];
      return `${more} finds are more tightly grouped than ${less} finds.`;
    }
    default:
      if (Math.min(t.nA, t.nB) < LOW_POWER_N)
        return `${a} and ${b}: too few to tell whether they go together or keep apart (${t.nA} and ${t.nB}).`;
      return `${a} and ${b}: no clear sign that they go together or keep apart.`;
  }
}

/** Badge words of a square-count test. */
export const SQUARE_BADGE: Record<SquareTestView["verdict"], string> = {
  clustered: "Rich squares lie together",
  dispersed: "Rich and poor squares alternate",
  "hot-spots": "Hot or cold spots",
  "no-evidence": "No clear pattern",
  "not-run": "Not run",
};

/** One sentence for a square-count test on one class. */
export function squareSentence(t: SquareTestView, who: string): string {
  switch (t.verdict) {
    case "clustered":
      return `${who}: squares rich in them lie next to each other, and so do poor ones, more than chance would give.`;
    case "dispersed":
      return `${who}: rich and poor squares alternate more than chance would give.`;
    case "hot-spots": {
      const hot = t.cells.filter((c) => c.class === "hot spot").length;
      const cold = t.cells.filter((c) => c.class === "cold spot").length;
      const spots = [
        hot && `${hot} hot spot${hot === 1 ? "" : "s"}`,
        cold && `${cold} cold spot${cold === 1 ? "" : "s"}`,
      ];
      const named = spots.filter(Boolean).join(" and ");
      return `${who}: ${named || "some squares stand out from their neighbours"}${named ? " among the squares" : ""}, more than chance would give.`;
    }
    case "no-evidence":
      return `${who}: no clear pattern in the counts by square.`;
    case "not-run":
      return `${who}: not tested by square.`;
  }
}
