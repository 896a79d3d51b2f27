import type { Preview } from "./import-wizard";

/** The first rows as read, then every refused row with its number and reasons. */
export function ImportReport({ preview: p }: { preview: Preview }) {
  const shown = p.errors.slice(0, 500);
  return (
    <div className="space-y-3">
      <p aria-live="polite">
        <span className="num">{p.rowCount}</span> rows ·{" "}
        <span className="num font-semibold text-ok">{p.validCount}</span> pass ·{" "}
        <span className={`num font-semibold ${p.errors.length ? "text-warn" : ""}`}>{p.errors.length}</span> refused ·{" "}
        <span className="num font-semibold" data-level-warnings={p.warnings.length}>
          {p.warnings.length}
        </span>{" "}
        level warnings
      </p>
      <div className="overflow-x-auto">
        <table className="ledger text-xs" aria-label="First rows of the file">
          <thead>
            <tr>
              <th className="num">Row</th>
              {p.headers.map((h) => (
                <th key={h}>{h}</th>
              ))}
            </tr>
          </thead>
          <tbody>
            {p.sample.map((r, i) => (
              <tr key={i}>
                <td className="num">{i + 2}</td>
                {r.map((c, k) => (
                  <td key={k} className="font-mono">
                    {c}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {p.errors.length > 0 && (
        <section aria-labelledby="refused-h" className="rounded border-2 border-warn bg-warn-light p-3">
          <h3 id="refused-h" className="font-bold text-warn">
            Rows to fix before anything is imported
          </h3>
          <ul className="mt-2 max-h-96 space-y-1 overflow-y-auto" aria-label="Refused rows">
            {shown.map((e) => (
              <li key={e.row}>
                <span className="num font-bold">Row {e.row}</span>: {e.reasons.join("; ")}
              </li>
            ))}
          </ul>
          {p.errors.length > shown.length && (
            <p className="mt-2 text-sm">
              …and {p.errors.length - shown.length} more rows; the first {shown.length} are listed. A wrong column
              mapping is the usual cause of so many.
            </p>
          )}
        </section>
      )}
      {p.warnings.length > 0 && (
        <section aria-labelledby="level-warnings-h" className="rounded border border-warn p-3">
          <h3 id="level-warnings-h" className="font-bold">
            Levels outside their context ({p.warnings.length} rows; they will be imported)
          </h3>
          <p className="text-sm text-ink-soft">
            The find&apos;s reduced level lies above its context&apos;s recorded top or below its recorded base by more
            than the site&apos;s levelling tolerance. Check the level or the context.
          </p>
          <ul className="mt-2 max-h-64 space-y-1 overflow-y-auto" aria-label="Level warnings">
            {p.warnings.slice(0, 500).map((w) => (
              <li key={w.row}>
                <span className="num font-bold">Row {w.row}</span>: {w.reasons.join("; ")}
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}
