import type { NumberRange } from "@/lib/server/number-accounting";
import type { SequenceAccounting } from "@/lib/server/sample-accounting";
import { numberHolder, numberReason, numberStatusOrder, numberStatusWords } from "./accounting-words";

const sequenceWords = { find: "find numbers", context: "context numbers", sample: "sample numbers" } as const;

/**
 * The number accounting that closes a printed register: totals (issued, used, reserved, void, never handed
 * out) and every run of numbers with its status, holder and reason.
 */
export function NumberAccountingTable({ accounting: a }: { accounting: SequenceAccounting }) {
  const issued = a.highest;
  const used = a.totals.find + a.totals.sample + a.totals.context;
  return (
    <section className="printed-accounting space-y-2" aria-labelledby="accounting-h" data-sequence={a.sequence}>
      <h2 id="accounting-h" className="text-xl font-bold">
        Number accounting: {sequenceWords[a.sequence]}
      </h2>
      <p className="text-sm">
        Every number from 1 to <span className="num">{issued}</span>, the highest handed out, and what became of it.
      </p>
      <dl className="grid grid-cols-[auto_auto] justify-start gap-x-6 text-sm" aria-label="Totals">
        <dt>Issued (1 to the highest)</dt>
        <dd className="num text-right" data-total="issued">
          {issued}
        </dd>
        <dt>Used by a record</dt>
        <dd className="num text-right" data-total="used">
          {used}
        </dd>
        {numberStatusOrder
          .filter((s) => a.totals[s] > 0 || s === "reserved" || s === "void")
          .map((s) => (
            <div key={s} className="contents">
              <dt>{numberStatusWords[s]}</dt>
              <dd className="num text-right" data-total={s}>
                {a.totals[s]}
              </dd>
            </div>
          ))}
      </dl>
      <NumberOverlaps overlaps={a.overlaps} />
      {a.ranges.length > 0 && <NumberRangesTable ranges={a.ranges} className="ledger printed-table" />}
    </section>
  );
}

/** Numbers the accounting found counted twice, which should never happen: said aloud where there are any. */
export function NumberOverlaps({ overlaps }: { overlaps: readonly number[] }) {
  if (overlaps.length === 0) return null;
  return (
    <p role="alert" className="font-semibold text-warn">
      Numbers counted twice (this should never happen; tell the site director):{" "}
      <span className="num">{overlaps.join(", ")}</span>
    </p>
  );
}

/**
 * Every run of numbers, one row a run: the numbers, how many, their status, who holds them and why — on
 * screen and on paper, each with its own table and row style.
 */
export function NumberRangesTable({
  ranges,
  className,
  rowClassName,
}: {
  ranges: readonly NumberRange[];
  className: string;
  rowClassName?: string;
}) {
  return (
    <table className={className} aria-label="Number accounting">
      <thead>
        <tr className="text-left">
          <th scope="col">Numbers</th>
          <th scope="col" className="num text-right">
            How many
          </th>
          <th scope="col">Status</th>
          <th scope="col">Held by</th>
          <th scope="col">Why</th>
        </tr>
      </thead>
      <tbody>
        {ranges.map((r, i) => (
          <tr key={i} className={rowClassName} data-first={r.first} data-last={r.last} data-status={r.status}>
            <td className="num">{r.first === r.last ? r.first : `${r.first}–${r.last}`}</td>
            <td className="num text-right">{r.last - r.first + 1}</td>
            <td className={r.status === "void" || r.status === "reserved" ? "font-semibold" : ""}>
              {numberStatusWords[r.status]}
            </td>
            <td>{numberHolder(r)}</td>
            <td>{numberReason(r)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
