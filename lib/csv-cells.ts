/**
 * Spreadsheet formula injection ("CSV injection"). OWASP's guidance
 * (https://owasp.org/www-community/attacks/CSV_Injection): a cell that begins with = + - @, a tab or a
 * carriage return is read as a formula by Excel, LibreOffice Calc and Google Sheets; prefix such a cell
 * with a single quote so it is shown as text, and wrap it in double quotes. Loamwork also treats the full-width forms
 * (＝ ＋ － ＠, which
 * East Asian input methods type and Excel accepts as formula starters), a line feed, and any of these
 * after leading blanks (Calc can trim them on import) as triggers.
 *
 * Numbers are never passed through here: numeric columns are written as numbers (lib/server/export/csv.ts), so a
 * negative coordinate keeps its minus sign and every text cell starting with "-" is made inert.
 */
const trigger = String.raw`(?:\s*[=+\-@\uFF1D\uFF0B\uFF0D\uFF20]|[\t\r\n])`;

/** Quotes already in front of a trigger are counted too, so the guard can be undone exactly on import. */
const needsGuard = new RegExp(`^'*${trigger}`);
const guarded = new RegExp(`^'+${trigger}`);

/** The text as a spreadsheet will show it and never evaluate it. */
export function inertText(value: string): string {
  return needsGuard.test(value) ? `'${value}` : value;
}

/** OWASP also wraps such a cell in double quotes: papaparse's `quotes` option, called with each written value. */
export function quoteGuarded(value: unknown): boolean {
  return typeof value === "string" && value.startsWith("'");
}

/** Undoes inertText: a cell read back from a Loamwork export gets its own text again. */
export function restoreText(cell: string): string {
  return guarded.test(cell) ? cell.slice(1) : cell;
}
