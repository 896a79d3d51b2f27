import type { VerdictWord } from "@/lib/patterns-view/test-view";

export const VERDICT_TONE: Record<VerdictWord, string> = {
  clustered: "border-accent bg-accent-light text-accent-dark",
  regular: "border-ok bg-ok-light text-ok",
  "no-evidence": "border-ink/30 bg-paper-deep text-ink",
  associated: "border-accent bg-accent-light text-accent-dark",
  segregated: "border-warn bg-warn-light text-warn",
};

/**
 * p as a reader needs it. Below 1e-12 the distribution tails (computed as 1 − cdf) carry no precision, so
 * such a p is shown as a bound, never as an exact 0.
 */
export const fmtP = (p: number | null) =>
  p === null ? "—" : p < 1e-12 ? "< 1e-12" : p < 0.001 ? p.toExponential(1) : p.toFixed(3);
export const fmtM = (v: number) => `${v.toFixed(2)} m`;

/** "about 12 s" from milliseconds, for the time-remaining line. */
export function fmtDuration(ms: number): string {
  if (!Number.isFinite(ms) || ms < 0) return "estimating…";
  const s = Math.round(ms / 1000);
  if (s < 1) return "under a second";
  if (s < 90) return `about ${s} s`;
  return `about ${Math.round(s / 60)} min`;
}

export const TEST_LABEL: Record<string, string> = {
  "clark-evans": "Clark–Evans",
  quadrat: "Quadrat counts",
  "l-envelope": "Besag's L under CSR",
  "pcf-envelope": "Pair correlation",
  "cross-l": "Cross-L",
  "k-difference": "K difference",
  "inhomogeneous-l": "Inhomogeneous L",
};
