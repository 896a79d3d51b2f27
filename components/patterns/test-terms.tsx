import { withoutP } from "./plain-words";

/** A test's own sentence (its p-value left to the header) and the question it answers, under a run's verdict. */
export function TestTerms({ sentence, question }: { sentence: string; question: string }) {
  return (
    <>
      <p className="text-sm">
        <span className="font-semibold">In the test&apos;s terms: </span>
        {withoutP(sentence)}
      </p>
      <p className="text-sm text-ink-soft">
        <span className="font-semibold">Question answered: </span>
        {question}
      </p>
    </>
  );
}

/** A test's notes, folded under a summary that counts them; nothing where there are none. */
export function TestNotes({ title, notes }: { title: string; notes: readonly string[] }) {
  if (notes.length === 0) return null;
  return (
    <details className="text-sm">
      <summary className="min-h-11 cursor-pointer py-2 font-semibold text-ink-soft">
        {title} ({notes.length})
      </summary>
      <ul className="list-disc pl-5">
        {notes.map((n, i) => (
          <li key={i}>{n}</li>
        ))}
      </ul>
    </details>
  );
}
