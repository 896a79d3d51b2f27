"use client";

import Link from "next/link";
import { usePendingBoxes } from "@/components/offline/use-pending-records";

export type BoxRegisterRow = {
  id: string;
  number: number;
  store: string;
  note: string;
  finds: number;
  samples: number;
};

/**
 * The box register's table: the server's boxes, then the boxes added on this device and not yet sent (from
 * the outbox, as the plan lists finds made offline), marked so, with no link until the server has them.
 */
export function BoxTable({ siteId, rows }: { siteId: string; rows: BoxRegisterRow[] }) {
  const queued = usePendingBoxes(siteId).filter((q) => !rows.some((r) => r.id === q.id));
  if (rows.length === 0 && queued.length === 0) return <p className="text-ink-soft">No boxes yet.</p>;
  const base = `/sites/${siteId}/boxes`;
  return (
    <table className="ledger sheet" aria-label="Box register">
      <thead>
        <tr>
          <th className="num">Box</th>
          <th>Store</th>
          <th className="num">Finds</th>
          <th className="num">Samples</th>
          <th>Note</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((b) => (
          <tr key={b.id} data-box={b.number}>
            <td className="num font-semibold">
              <Link className="underline" href={`${base}/${b.id}`}>
                {b.number}
              </Link>
            </td>
            <td>{b.store || "—"}</td>
            <td className="num">{b.finds}</td>
            <td className="num">{b.samples}</td>
            <td>{b.note}</td>
          </tr>
        ))}
        {queued.map((q) => (
          <tr key={q.id} data-box={q.number ?? "next"} data-queued={q.state}>
            <td className="num font-semibold">{q.number ?? "next"}</td>
            <td>{q.store || "—"}</td>
            <td className="num">—</td>
            <td className="num">—</td>
            <td>
              {q.note && <>{q.note} · </>}
              <span className={q.state === "attention" ? "font-semibold text-warn" : "text-ink-soft"}>
                {q.state === "attention"
                  ? "needs attention: refused by the server, see This device"
                  : "waiting to be sent from this device"}
              </span>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
