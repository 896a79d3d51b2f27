import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { plotCsv } from "@/components/patterns/export-plot";
import { inertText, restoreText } from "./csv-cells";

// Triggers from OWASP, "CSV Injection" (= + - @ tab CR), plus the full-width forms and leading blanks.
const risky = [
  "=1+1",
  "+1",
  "-2+3+cmd|' /C calc'!A0",
  "@SUM(A1)",
  "\t=1",
  "\r=1",
  "\n=1",
  "＝1+1",
  "＋1",
  "－1",
  "＠A1",
  " =1",
  "'=1",
  "''-1",
];
const plain = ["flint flake", "1-2 cm", "e-mail@host", "'quoted'", "", "2026-11-20T10:00:00.000Z", "A=B"];

describe("inert CSV text", () => {
  it("prefixes every formula trigger with a single quote and leaves other text alone", () => {
    for (const t of risky) expect(inertText(t)).toBe(`'${t}`);
    for (const t of plain) expect(inertText(t)).toBe(t);
  });

  it("is undone exactly by restoreText, for guarded and plain text alike", () => {
    for (const t of [...risky, ...plain]) expect(restoreText(inertText(t))).toBe(t);
  });

  it("the Patterns page's CSV keeps numbers and guards text", () => {
    const text = plotCsv([{ r: -0.5, label: "-1+1", class: "=cmd" }]);
    expect(text.split("\r\n")[1]).toBe(`-0.5,"'-1+1","'=cmd"`);
    expect(Papa.parse<string[]>(text.trim()).data).toEqual([
      ["r", "label", "class"],
      ["-0.5", "'-1+1", "'=cmd"],
    ]);
  });
});
