"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useState } from "react";
import { apiClient } from "@/lib/api/client";
import type { PackageJob } from "@/lib/api/catalog/packages";
import { useDates } from "@/components/locale";

type Props = { siteId: string; signedOffTrenches: { id: string; code: string }[] };

const busy = (p: PackageJob) => p.status === "queued" || p.status === "running";

function size(bytes: number | null): string {
  if (bytes === null) return "";
  if (bytes >= 1024 * 1024) return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
  return `${Math.max(1, Math.round(bytes / 1024))} KB`;
}

/**
 * The deposition package, written on the server as a job: the director chooses the whole site or a
 * signed-off trench, follows the files written, and downloads the zip once it is complete, with its
 * fingerprint to quote to the repository.
 */
export function PackagePanel({ siteId, signedOffTrenches }: Props) {
  const qc = useQueryClient();
  const { when } = useDates();
  const scopeId = useId();
  const [trenchId, setTrenchId] = useState("");
  const packages = useQuery({
    queryKey: ["packages", siteId],
    queryFn: () => apiClient.call("packagesList", { siteId }),
    // Followed while one is being written; still once written.
    refetchInterval: (q) => (q.state.data?.some(busy) ? 700 : false),
  });
  const start = useMutation({
    mutationFn: () => apiClient.call("packagesCreate", { siteId }, trenchId ? { trenchId } : {}),
    onSuccess: async (job) => {
      // A list read still on its way was asked before this package existed: cancelled, or its answer would
      // replace the list without the new package and stop the following.
      await qc.cancelQueries({ queryKey: ["packages", siteId] });
      qc.setQueryData(["packages", siteId], (old: PackageJob[] | undefined) => [job, ...(old ?? [])]);
    },
  });
  const fieldError = (start.error as { fieldErrors?: Record<string, string[]> } | null)?.fieldErrors?.trenchId?.[0];

  return (
    <div className="mt-2 space-y-3">
      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          start.mutate();
        }}
      >
        <div>
          <label htmlFor={scopeId} className="block text-sm font-semibold">
            Package of
          </label>
          <select
            id={scopeId}
            className="field"
            value={trenchId}
            onChange={(e) => setTrenchId(e.target.value)}
            aria-describedby={fieldError ? `${scopeId}-error` : undefined}
          >
            <option value="">the whole site</option>
            {signedOffTrenches.map((t) => (
              <option key={t.id} value={t.id}>
                trench {t.code} (signed off)
              </option>
            ))}
          </select>
        </div>
        <button type="submit" className="btn" disabled={start.isPending}>
          {start.isPending ? "Starting…" : "Write the package"}
        </button>
      </form>
      <p id={`${scopeId}-error`} className="field-error" aria-live="polite">
        {start.error ? (fieldError ?? (start.error as Error).message) : ""}
      </p>
      {packages.error && (
        <p role="alert" className="text-warn">
          {(packages.error as Error).message}
        </p>
      )}
      {packages.data && packages.data.length > 0 && (
        <ul className="space-y-2" aria-label="Packages written">
          {packages.data.map((p) => (
            <PackageRow key={p.id} siteId={siteId} job={p} when={when} />
          ))}
        </ul>
      )}
    </div>
  );
}

function PackageRow({ siteId, job, when }: { siteId: string; job: PackageJob; when: (at: string) => string }) {
  const pct = job.filesTotal ? Math.round((job.filesDone / job.filesTotal) * 100) : 0;
  const scope = job.trench ? `Trench ${job.trench}` : "The whole site";
  return (
    <li className="rounded border border-paper-edge px-3 py-2" data-package={job.id} data-status={job.status}>
      <p className="font-semibold">
        {scope} · <span className="text-sm font-normal">started by {job.createdBy}</span>{" "}
        <span className="num text-sm font-normal">{when(job.createdAt)}</span>
      </p>
      {busy(job) && (
        <div className="mt-1 space-y-1">
          <p className="num text-sm" aria-live="polite">
            {job.status === "queued"
              ? "Waiting to start…"
              : `${job.filesDone} of ${job.filesTotal || "…"} files written`}
          </p>
          <div
            role="progressbar"
            aria-valuemin={0}
            aria-valuemax={job.filesTotal || 1}
            aria-valuenow={job.filesDone}
            aria-label="Files written"
            className="h-3 w-full max-w-md overflow-hidden rounded border border-ink/40 bg-paper-deep"
          >
            <div className="h-full w-full origin-left bg-accent" style={{ transform: `scaleX(${pct / 100})` }} />
          </div>
          <p className="text-xs text-ink-soft">It goes on on the server if you leave this page.</p>
        </div>
      )}
      {job.status === "failed" && (
        <p role="alert" className="text-warn">
          Not written: {job.error}
        </p>
      )}
      {job.status === "done" && (
        <div className="mt-1 space-y-1 text-sm">
          <p>
            <span className="num">{job.filesTotal}</span> files · <span className="num">{size(job.bytes)}</span>
            {job.finishedAt && (
              <>
                {" "}
                · written <span className="num">{when(job.finishedAt)}</span>
              </>
            )}
          </p>
          <p className="break-all">
            Fingerprint (SHA-256 of manifest-sha256.txt):{" "}
            <code className="num" data-fingerprint>
              {job.fingerprint}
            </code>
          </p>
          {job.fileKept ? (
            <a
              className="btn inline-flex"
              href={`/api/sites/${siteId}/packages/${job.id}/file`}
              download={job.fileName ?? undefined}
            >
              Download {job.fileName}
            </a>
          ) : (
            <p className="text-ink-soft">
              The file was removed when newer packages were written: the newest three of the whole site and of each
              trench are kept. Write the package again to download it.
            </p>
          )}
        </div>
      )}
    </li>
  );
}
