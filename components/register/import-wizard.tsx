"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";
import {
  importColumnHints,
  importFieldLabels,
  importFields,
  importMappingSchema,
  zReferenceLabels,
  zReferences,
  type ImportMapping,
  type ImportRowError,
} from "@/lib/schemas/import";
import { FormField } from "@/components/contexts/form-field";
import { ApiError, apiClient } from "@/lib/api/client";
import type { ApiAnswer } from "@/lib/api/client";
import { ImportReport } from "./import-report";

export type Preview = ApiAnswer<"importPreview">;
const required = new Set(["x", "y", "classCode", "contextNumber"]);
const sourceWords = {
  given: "as you mapped it",
  remembered: "as this site mapped its last file",
  guessed: "guessed from the headers; check it",
};

/** Upload → map columns (remembered per site) → check every row → import all rows or none. */
export function ImportWizard({ siteId }: { siteId: string }) {
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [preview, setPreview] = useState<Preview | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const [done, setDone] = useState<{
    imported: number;
    firstNumber: number;
    lastNumber: number;
    warnings: number;
  } | null>(null);
  const [zReference, setZReference] = useState<(typeof zReferences)[number]>("rl");
  const form = useForm<ImportMapping>({ resolver: zodResolver(importMappingSchema) });

  async function check(text: string, name: string, mapping?: ImportMapping, zRef = zReference) {
    setBusy("Checking every row…");
    setFailure(null);
    setDone(null);
    try {
      const p = await apiClient.call(
        "importPreview",
        { siteId },
        { csv: text, fileName: name, mapping, zReference: zRef },
      );
      setPreview(p);
      form.reset(p.mapping as ImportMapping);
      for (const [k, msgs] of Object.entries(p.mappingProblems))
        form.setError(k.replace("mapping.", "") as keyof ImportMapping, { message: msgs.join(" ") });
    } catch (err) {
      setFailure(err instanceof Error ? err.message : String(err));
    } finally {
      setBusy(null);
    }
  }

  async function commit(mapping: ImportMapping) {
    if (!file) return;
    setBusy("Importing…");
    setFailure(null);
    try {
      setDone(
        await apiClient.call("importCommit", { siteId }, { csv: file.text, fileName: file.name, mapping, zReference }),
      );
      setPreview(null);
      setFile(null);
    } catch (err) {
      const errors = err instanceof ApiError ? (err.detail("errors") as ImportRowError[] | undefined) : undefined;
      if (errors && preview) setPreview({ ...preview, errors, validCount: preview.rowCount - errors.length });
      setFailure(err instanceof Error ? err.message : String(err));
    } finally {
      setBusy(null);
    }
  }

  const clean =
    preview && Object.keys(preview.mappingProblems).length === 0 && preview.errors.length === 0 && preview.rowCount > 0;
  return (
    <div className="space-y-4">
      <section className="sheet space-y-2">
        <label className="label" htmlFor="ts-file">
          Total-station export (CSV with a header row)
        </label>
        <input
          id="ts-file"
          type="file"
          accept=".csv,.txt,text/csv"
          className="field"
          onChange={async (e) => {
            const f = e.target.files?.[0];
            if (!f) return;
            const text = await f.text();
            setFile({ name: f.name, text });
            await check(text, f.name);
          }}
        />
        <p className="text-xs text-ink-faint">
          Nothing is imported until every row passes. Row numbers below count the header as row 1, as a spreadsheet
          shows them.
        </p>
        {!file && (
          <details open className="text-sm" aria-label="Columns the import reads">
            <summary className="cursor-pointer font-semibold">Columns the import reads</summary>
            <p className="mt-1">
              One row per find, with a header row. Starred columns are needed; the rest are kept when present. You can
              change which column feeds which field once the file is read.
            </p>
            <dl className="mt-1 grid gap-x-4 gap-y-1 sm:grid-cols-[14rem_1fr]">
              {importFields.map((f) => (
                <div key={f} className="contents">
                  <dt className="font-semibold">
                    {importFieldLabels[f]}
                    {required.has(f) ? " *" : ""}
                  </dt>
                  <dd className="text-ink-soft">{importColumnHints[f]}</dd>
                </div>
              ))}
            </dl>
          </details>
        )}
      </section>
      <p aria-live="polite" className="font-semibold">
        {busy ?? ""}
      </p>
      {done && (
        <p role="status" className="rounded border-2 border-ok bg-ok-light p-3 font-semibold text-ok">
          Imported <span className="num">{done.imported}</span> finds, numbers{" "}
          <span className="num">{done.firstNumber}</span>–<span className="num">{done.lastNumber}</span>.{" "}
          {done.warnings > 0 && (
            <span className="text-warn">
              <span className="num">{done.warnings}</span> with a level outside their context&apos;s recorded top and
              base.{" "}
            </span>
          )}
          <Link className="underline" href={`/sites/${siteId}/finds?sort=number&dir=desc`}>
            See them in the register
          </Link>
        </p>
      )}
      {preview && file && (
        <form className="sheet space-y-3" aria-label="Map the columns" onSubmit={form.handleSubmit(commit)} noValidate>
          <h2 className="text-lg font-bold">
            Columns of {file.name}{" "}
            <span className="text-sm font-normal text-ink-soft">— {sourceWords[preview.mappingSource]}</span>
          </h2>
          <div className="grid gap-3 sm:grid-cols-3 lg:grid-cols-5">
            {importFields.map((f) => (
              <FormField
                key={f}
                id={`map-${f}`}
                label={`${importFieldLabels[f]}${required.has(f) ? " *" : ""}`}
                error={form.formState.errors[f]?.message}
              >
                <select
                  id={`map-${f}`}
                  className="field"
                  {...form.register(f, { setValueAs: (v) => (v === "" ? undefined : v) })}
                >
                  <option value="">{required.has(f) ? "— pick —" : "(none)"}</option>
                  {preview.headers.map((h) => (
                    <option key={h} value={h}>
                      {h}
                    </option>
                  ))}
                </select>
              </FormField>
            ))}
          </div>
          <div className="max-w-xl">
            <label className="label" htmlFor="z-reference">
              The z column holds
            </label>
            <select
              id="z-reference"
              className="field"
              value={zReference}
              onChange={(e) => {
                const next = e.target.value as (typeof zReferences)[number];
                setZReference(next);
                void form.handleSubmit((m) => check(file.text, file.name, m, next))();
              }}
            >
              {zReferences.map((z) => (
                <option key={z} value={z}>
                  {zReferenceLabels[z]}
                </option>
              ))}
            </select>
            <p className="text-xs text-ink-faint">
              Loamwork keeps every z as a reduced level. Depths are converted with the trench&apos;s surface level, and
              refused where the trench has none.
            </p>
          </div>
          <div className="flex flex-wrap gap-2">
            <button
              type="button"
              className="btn"
              disabled={!!busy}
              onClick={form.handleSubmit((m) => check(file.text, file.name, m))}
            >
              Remember this mapping and check again
            </button>
            <button type="submit" className="btn-primary" disabled={!clean || !!busy}>
              Import all {preview.rowCount} rows
            </button>
          </div>
          <ImportReport preview={preview} />
        </form>
      )}
      <p role="alert" aria-live="assertive" className="field-error">
        {failure ?? ""}
      </p>
    </div>
  );
}
