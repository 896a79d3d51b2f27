import Papa from "papaparse";
import { restoreText } from "@/lib/csv-cells";
import { badInput } from "@/lib/server/errors";

export type ParsedCsv = {
  headers: string[];
  /** Data rows as arrays of cells, in file order (row i is spreadsheet row i + 2). */
  rows: string[][];
  /** Rows papaparse could not split cleanly, by data-row index. */
  rowProblems: Map<number, string>;
};

/**
 * Splits a total-station CSV export with papaparse (delimiter detected: comma, semicolon or tab).
 * The first row must be the header; a file without one cannot be mapped.
 */
export function parseCsv(text: string): ParsedCsv {
  const out = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), {
    header: false,
    skipEmptyLines: "greedy",
    delimitersToGuess: [",", ";", "\t", "|"],
  });
  // A Loamwork export guards formula-like text with a leading quote; reading it back undoes exactly that.
  const [head, ...rows] = out.data.map((r) => r.map(restoreText));
  if (!head || head.every((h) => !h.trim()))
    throw badInput("The file has no header row; the first row must name the columns.");
  const headers = head.map((h) => h.trim());
  const seen = new Set<string>();
  for (const h of headers) {
    if (!h) continue;
    if (seen.has(h)) throw badInput(`The header "${h}" appears twice; give each column its own name.`);
    seen.add(h);
  }
  const rowProblems = new Map<number, string>();
  for (const e of out.errors) {
    // papaparse counts the header as row 0 when header:false.
    if (typeof e.row === "number" && e.row > 0 && e.code !== "UndetectableDelimiter")
      rowProblems.set(e.row - 1, e.message);
  }
  rows.forEach((r, i) => {
    if (r.length !== headers.length && !rowProblems.has(i))
      rowProblems.set(i, `has ${r.length} cells where the header has ${headers.length}`);
  });
  return { headers, rows, rowProblems };
}
