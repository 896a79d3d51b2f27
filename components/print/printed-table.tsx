import type { ReactNode } from "react";

/** A column of a printed table: its heading, or `{ num }` for a column of numbers, set to line up. */
export type PrintedColumn = string | { num: string };

/**
 * A table of a printed register: headed by its columns, which paper repeats at the top of every sheet
 * (print.css), and labelled for a screen reader.
 */
export function PrintedTable({
  label,
  columns,
  children,
}: {
  label: string;
  columns: PrintedColumn[];
  children: ReactNode;
}) {
  return (
    <table className="ledger printed-table" aria-label={label}>
      <thead>
        <tr>
          {columns.map((c) =>
            typeof c === "string" ? (
              <th key={c} scope="col">
                {c}
              </th>
            ) : (
              <th key={c.num} scope="col" className="num">
                {c.num}
              </th>
            ),
          )}
        </tr>
      </thead>
      <tbody>{children}</tbody>
    </table>
  );
}

/** A length in metres to the millimetre, or nothing where none was recorded. */
export const metres = (v: number | null) => (v === null ? "" : v.toFixed(3));
