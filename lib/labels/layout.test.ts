import { describe, expect, it } from "vitest";
import { A4, labelPosition, labelPresets, layoutQuery, perSheet } from "./layout";

describe("label layouts", () => {
  it("every preset fits on A4", () => {
    for (const [key, p] of Object.entries(labelPresets)) {
      const l = p.layout;
      const last = labelPosition(l, perSheet(l) - 1);
      expect(last.x + l.widthMm, key).toBeLessThanOrEqual(A4.widthMm + 0.01);
      expect(last.y + l.heightMm, key).toBeLessThanOrEqual(A4.heightMm + 0.01);
    }
  });

  it("a typed measure overrides the preset; strings from the form are read as numbers", () => {
    const r = layoutQuery.parse({ preset: "14", rows: "6", topMm: "20" });
    expect(r.layout).toEqual({ ...labelPresets["14"].layout, rows: 6, topMm: 20 });
    // Row by row from the top left: the third label of a 2-column sheet starts the second row.
    expect(labelPosition(r.layout, 2)).toEqual({ x: 4.65, y: 20 + 38.1 });
  });

  it("refuses a layout that runs off the sheet, naming the measure", () => {
    const r = layoutQuery.safeParse({ preset: "21", columns: "4" });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]!.path).toEqual(["widthMm"]);
    // 7.25 mm margin + 4 × 63.5 mm labels + 3 × 2.5 mm gaps = 268.75 mm.
    expect(r.error!.issues[0]!.message).toBe("The labels reach 268.8 mm across; an A4 sheet is 210 mm wide.");
    expect(layoutQuery.safeParse({ heightMm: "10" }).error!.issues[0]!.message).toBe(
      "The label height is at least 15 mm.",
    );
  });
});
