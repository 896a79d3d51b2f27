import { describe, expect, it } from "vitest";
import { z } from "zod";
import { metres, numeric } from "./common";

describe("numbers are read strictly", () => {
  // What z.coerce.number() used to make of these: 1, 3, 3, 0, 0, 0, 1000, 16.
  const refused: [string, unknown][] = [
    ["true", true],
    ["[3]", [3]],
    ['"0x3"', "0x3"],
    ["null", null],
    ['""', ""],
    ['"  "', "  "],
    ['"1e3"', "1e3"],
    ['"0x10"', "0x10"],
    ['"Infinity"', "Infinity"],
    ["Infinity", Infinity],
    ["NaN", NaN],
    ['"3 m"', "3 m"],
    ["{}", {}],
  ];
  for (const [what, value] of refused) {
    it(`refuses ${what} as a coordinate`, () => {
      const r = metres.safeParse(value);
      expect(r.success).toBe(false);
      expect(r.error!.issues[0].message).toMatch(/metres/);
    });
  }

  const accepted: [unknown, number][] = [
    [3, 3],
    [-2.5, -2.5],
    ["2.5", 2.5],
    [" 12.125 ", 12.125],
    [".5", 0.5],
    ["-0.75", -0.75],
    ["+4", 4],
  ];
  for (const [value, want] of accepted) {
    it(`reads ${JSON.stringify(value)} as ${want} m`, () => {
      expect(metres.parse(value)).toBe(want);
    });
  }

  it("keeps the inner schema's own checks (a whole number stays a whole number)", () => {
    const whole = numeric(z.number().int());
    expect(whole.safeParse("4").data).toBe(4);
    expect(whole.safeParse("4.5").success).toBe(false);
    expect(whole.safeParse(false).success).toBe(false);
  });
});
