/** Verdicts in the words of statistics.md: clustered / evenly spread / no evidence against the null. */
import type { TestSpec } from "./run-spec";

export type Verdict = "clustered" | "evenly spread" | "together" | "apart" | "no evidence against the null";

export interface VerdictText {
  verdict: Verdict;
  test: string;
  nullName: string;
  summary: string;
}

const pct = (level: number) => `${Math.round(level * 1000) / 10} %`;

/** `direction` +1 when the observed statistic lies above the null (more pairs near: clustering). */
export function verdictOf(t: TestSpec, p: number, level: number, direction: number, testName?: string): VerdictText {
  const reject = p <= level;
  const statName =
    "statistic" in t ? ({ mad: "MAD", dclf: "DCLF", rank: "global rank envelope (ERL)" } as const)[t.statistic] : "";
  const at = `at the ${pct(level)} level (p = ${p.toPrecision(3)})`;
  if (t.type === "cross-l" || t.type === "k-difference") {
    const nullName =
      t.type === "k-difference" || t.null === "random-labelling"
        ? "random labelling"
        : `class ${t.a} fixed, class ${t.b} CSR`;
    const test =
      t.type === "k-difference"
        ? `K difference K_${t.a}${t.a} − K_${t.b}${t.b}, ${statName} test`
        : `cross-${t.fun} (${t.a}→${t.b}), ${statName} test`;
    if (!reject)
      return {
        verdict: "no evidence against the null",
        test,
        nullName,
        summary: `No evidence against ${nullName} ${at}.`,
      };
    if (t.type === "k-difference") {
      const more = direction > 0 ? t.a : t.b;
      return {
        verdict: "clustered",
        test,
        nullName,
        summary: `Class ${more} is more clustered than the other, against random labelling ${at}.`,
      };
    }
    const verdict: Verdict = direction > 0 ? "together" : "apart";
    return {
      verdict,
      test,
      nullName,
      summary: `Classes ${t.a} and ${t.b} ${verdict === "together" ? "go together" : "keep apart"} ${at}.`,
    };
  }
  const nullName = t.type === "inhomogeneous-l" ? "inhomogeneous Poisson" : "CSR";
  const test =
    t.type === "l-envelope"
      ? `Besag's L, ${statName} test`
      : t.type === "pcf-envelope"
        ? `pair correlation g, ${statName} test`
        : t.type === "inhomogeneous-l"
          ? `inhomogeneous L, ${statName} test`
          : (testName ?? (t.type === "clark-evans" ? `Clark–Evans R (${t.correction})` : "quadrat counts"));
  if (!reject)
    return {
      verdict: "no evidence against the null",
      test,
      nullName,
      summary: `No evidence against ${nullName} ${at}.`,
    };
  const verdict: Verdict = direction > 0 ? "clustered" : "evenly spread";
  return { verdict, test, nullName, summary: `The finds are ${verdict} ${at} (${test}).` };
}
