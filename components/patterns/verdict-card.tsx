import type { TestView } from "@/lib/patterns-view/test-view";
import { departureSentences } from "./departures";
import { badgeWords } from "./plain-words";
import { TestNotes, TestTerms } from "./test-terms";
import { fmtP, TEST_LABEL, VERDICT_TONE } from "./words";

/**
 * One test's verdict: the answer in plain words with p (once, in one format), then the detail line in the
 * test's own terms, what it asked, where the curve left the band.
 */
export function VerdictCard({ t, rmax, subject }: { t: TestView; rmax: number; subject: string }) {
  const deps =
    "departures" in t
      ? departureSentences(
          t.departures,
          rmax,
          t.kind === "l-envelope" || t.kind === "inhomogeneous-l" ? "l" : "cross",
          t.verdict !== "no-evidence",
        )
      : [];
  return (
    <article className="sheet space-y-2" aria-label={`${TEST_LABEL[t.kind]} for ${subject}`}>
      <header className="flex flex-wrap items-baseline gap-3">
        <h4 className="font-bold">{TEST_LABEL[t.kind]}</h4>
        <span
          data-verdict={t.verdict}
          className={`rounded border-2 px-2 py-0.5 text-sm font-bold ${VERDICT_TONE[t.verdict]}`}
        >
          {badgeWords(t)}
        </span>
        <span
          className="num text-sm"
          data-testid="p-value"
        >{`p ${t.p !== null && t.p < 1e-12 ? "" : "= "}${fmtP(t.p)}`}</span>
      </header>
      <TestTerms sentence={t.sentence} question={t.question} />
      {deps.length > 0 && (
        <ul className="list-disc pl-5 text-sm">
          {deps.map((d, i) => (
            <li key={i}>{d}</li>
          ))}
        </ul>
      )}
      <TestNotes title="Notes on this test" notes={t.notes} />
    </article>
  );
}
