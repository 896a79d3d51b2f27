import { describe, expect, it } from "vitest";
import { labelCode, labelPath, parseLabelCode } from "./code";

describe("label codes", () => {
  it("reads back what it writes, bare and behind an address", () => {
    for (const ref of [
      { siteCode: "WHD26", kind: "F" as const, number: 1234 },
      { siteCode: "ab-2", kind: "S" as const, number: 99_999_999 },
      { siteCode: "WHD26", kind: "B" as const, number: 12 },
    ]) {
      expect(parseLabelCode(labelCode(ref))).toEqual(ref);
      expect(parseLabelCode(labelCode(ref, "https://loamwork.example.org/"))).toEqual(ref);
      expect(parseLabelCode(labelCode(ref, "http://10.0.0.2:3000/lw"))).toEqual(ref);
    }
    expect(labelCode({ siteCode: "WHD26", kind: "F", number: 7 })).toBe("LW/WHD26/F/7");
    expect(labelCode({ siteCode: "WHD26", kind: "S", number: 7 }, "https://lw.example.org")).toBe(
      "https://lw.example.org/l/WHD26/S/7",
    );
    expect(labelPath({ siteCode: "WHD26", kind: "S", number: 7 })).toBe("/l/WHD26/S/7");
    expect(labelCode({ siteCode: "WHD26", kind: "B", number: 12 })).toBe("LW/WHD26/B/12");
  });

  it("refuses texts that are not Loamwork labels", () => {
    for (const t of [
      "",
      "LW/WHD26/X/7",
      "LW/WHD26/F/0",
      "LW/W/F/7",
      "https://example.org/f/WHD26/F/7",
      "LW/WHD26/F/7?x=1",
      "javascript:alert(1)/l/WHD26/F/7",
    ]) {
      expect(parseLabelCode(t), t).toBeNull();
    }
  });
});
