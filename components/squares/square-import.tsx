"use client";

import { useState } from "react";
import { ApiError, apiClient, type ApiAnswer } from "@/lib/api/client";

type Report = ApiAnswer<"squareImport">;

/**
 * Square counts from a CSV file (header: square, context, spit, class, count, weight_g, excavated_m2): every
 * row is checked first; the file is imported whole or not at all, with each refused row and its reasons.
 */
export function SquareImport({ siteId, trenchId }: { siteId: string; trenchId: string }) {
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [report, setReport] = useState<Report | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const send = async (dryRun: boolean) => {
    if (!file) return;
    setMessage(null);
    try {
      const r = await apiClient.call(
        "squareImport",
        { siteId },
        { trenchId, csv: file.text, fileName: file.name, dryRun },
      );
      setReport(r);
      if (!dryRun) setMessage(`Imported ${r.rowCount} rows into ${r.squares} square records.`);
    } catch (err) {
      const errors = err instanceof ApiError ? (err.detail("errors") as Report["errors"] | undefined) : undefined;
      if (errors) setReport({ dryRun: false, rowCount: 0, validCount: 0, squares: 0, errors, importId: null });
      setMessage(err instanceof Error ? err.message : String(err));
    }
  };
  return (
    <div className="space-y-2">
      <p className="text-sm text-ink-soft">
        One row per square, context, spit and class. Columns: <code>square</code> (south-west corner, easting/northing),{" "}
        <code>context</code>, <code>spit</code> (optional), <code>class</code>, <code>count</code>,{" "}
        <code>weight_g</code> and <code>excavated_m2</code> (optional).
      </p>
      <input
        type="file"
        accept=".csv,text/csv"
        aria-label="Square-count CSV file"
        onChange={async (e) => {
          const f = e.target.files?.[0];
          setReport(null);
          setMessage(null);
          setFile(f ? { name: f.name, text: await f.text() } : null);
        }}
      />
      <div className="flex gap-2">
        <button type="button" className="btn" disabled={!file} onClick={() => void send(true)}>
          Check the rows
        </button>
        <button
          type="button"
          className="btn-primary"
          disabled={!file || !report || report.errors.length > 0 || !report.dryRun}
          onClick={() => void send(false)}
        >
          Import
        </button>
      </div>
      {report && report.dryRun && (
        <p aria-live="polite">
          <span className="num">{report.rowCount}</span> rows · <span className="num text-ok">{report.validCount}</span>{" "}
          pass · <span className={`num ${report.errors.length ? "text-warn" : ""}`}>{report.errors.length}</span>{" "}
          refused · {report.squares} square records
        </p>
      )}
      {report && report.errors.length > 0 && (
        <ul
          className="max-h-64 overflow-y-auto rounded border-2 border-warn bg-warn-light p-2 text-sm"
          aria-label="Refused rows"
        >
          {report.errors.slice(0, 500).map((e) => (
            <li key={e.row}>
              <span className="num font-bold">Row {e.row}</span>: {e.reasons.join("; ")}
            </li>
          ))}
        </ul>
      )}
      <p role="status" aria-live="polite">
        {message ?? ""}
      </p>
    </div>
  );
}
