"use client";

import Link from "next/link";
import { useState } from "react";
import type { SampleRow } from "@/lib/api/archive-responses";
import { sampleStatusLabels, sampleTypeLabels } from "@/lib/schemas/sample";
import { SampleBoxControl, SampleStatusControl } from "./sample-actions";

const metres = (v: number | null) => (v === null ? "—" : v.toFixed(3));

/** The samples register's rows, with a tick per row for setting the processing status of many at once. */
export function SamplesTable({
  siteId,
  rows,
  boxes,
}: {
  siteId: string;
  rows: SampleRow[];
  boxes: { id: string; number: number; store: string }[];
}) {
  const [picked, setPicked] = useState<Set<string>>(new Set());
  const toggle = (id: string) =>
    setPicked((p) => {
      const next = new Set(p);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  const all = rows.length > 0 && rows.every((r) => picked.has(r.id));
  return (
    <div className="space-y-3">
      <SampleStatusControl siteId={siteId} sampleIds={[...picked]} onDone={() => setPicked(new Set())} />
      <SampleBoxControl siteId={siteId} sampleIds={[...picked]} boxes={boxes} onDone={() => setPicked(new Set())} />
      <div className="overflow-x-auto">
        <table className="ledger sheet" aria-label="Samples register">
          <thead>
            <tr>
              <th>
                <input
                  type="checkbox"
                  aria-label="Pick every sample on this page"
                  className="size-5"
                  checked={all}
                  onChange={() => setPicked(all ? new Set() : new Set(rows.map((r) => r.id)))}
                />
              </th>
              <th className="num">Sample</th>
              <th>Trench</th>
              <th className="num">Context</th>
              <th className="num">Spit</th>
              <th>Kind</th>
              <th className="num">x (m)</th>
              <th className="num">y (m)</th>
              <th className="num">RL (m)</th>
              <th className="num">Volume (l)</th>
              <th>Purpose</th>
              <th>Taken by</th>
              <th className="num">Taken on</th>
              <th>Status</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id}>
                <td>
                  <input
                    type="checkbox"
                    className="size-5"
                    aria-label={`Pick sample ${r.number}`}
                    checked={picked.has(r.id)}
                    onChange={() => toggle(r.id)}
                  />
                </td>
                <td className="num">
                  <Link className="font-bold underline" href={`/sites/${siteId}/samples/${r.id}`}>
                    {r.number}
                  </Link>
                </td>
                <td>{r.trenchCode}</td>
                <td className="num">{r.contextNumber}</td>
                <td className="num">{r.spitNumber ?? "—"}</td>
                <td>{sampleTypeLabels[r.type]}</td>
                <td className="num">{metres(r.x)}</td>
                <td className="num">{metres(r.y)}</td>
                <td className="num">{metres(r.z)}</td>
                <td className="num">{r.volumeL ?? "—"}</td>
                <td>
                  <span className="block max-w-xs truncate">{r.purpose}</span>
                </td>
                <td>{r.takenBy ?? "—"}</td>
                <td className="num">{r.takenOn}</td>
                <td>{sampleStatusLabels[r.status]}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
