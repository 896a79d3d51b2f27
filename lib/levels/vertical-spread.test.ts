import { describe, expect, it } from "vitest";
import { DEFAULT_LEVEL_SPREAD_CAUTION, verticalSpread } from "./vertical-spread";

describe("vertical spread of a class's finds", () => {
  it("gives R's default quartiles (type 7) and the highest minus lowest level", () => {
    // R 4.x, quantile(c(41.10, 41.20, 41.30, 41.60)): 41.100 41.175 41.250 41.375 41.600 (type 7, from memory
    // of the definition in Hyndman & Fan 1996, The American Statistician 50:361–365).
    const s = verticalSpread([41.3, 41.1, 41.6, 41.2], 0.2);
    expect(s.n).toBe(4);
    expect(s.withLevel).toBe(4);
    expect(s.min).toBe(41.1);
    expect(s.q1).toBeCloseTo(41.175, 9);
    expect(s.median).toBeCloseTo(41.25, 9);
    expect(s.q3).toBeCloseTo(41.375, 9);
    expect(s.max).toBe(41.6);
    expect(s.spread).toBe(0.5);
    expect(s.mixes).toBe(true);
  });

  it("counts finds with no level apart, never as a level of 0", () => {
    const s = verticalSpread([41.2, null, 41.25, null], 0.2);
    expect(s.n).toBe(4);
    expect(s.withLevel).toBe(2);
    expect(s.min).toBe(41.2); // a null taken as 0 would make the lowest 0 and the spread 41.25 m
    expect(s.spread).toBe(0.05);
    expect(s.mixes).toBe(false);
  });

  it("cautions only a spread above the threshold, read to the millimetre", () => {
    // 41.3 − 41.1 is 0.19999999999999574 in floating point: equal to 0.2 m, so no caution.
    expect(verticalSpread([41.1, 41.3], 0.2).mixes).toBe(false);
    expect(verticalSpread([41.1, 41.301], 0.2).mixes).toBe(true);
    expect(verticalSpread([41.1, 41.301], 0.25).mixes).toBe(false);
  });

  it("says nothing about the spread of one levelled find or of none", () => {
    expect(verticalSpread([41.2], 0.2)).toMatchObject({
      withLevel: 1,
      min: 41.2,
      max: 41.2,
      spread: null,
      mixes: false,
    });
    expect(verticalSpread([null, null], 0.2)).toMatchObject({ n: 2, withLevel: 0, min: null, spread: null });
    expect(verticalSpread([], 0.2)).toMatchObject({ n: 0, withLevel: 0, spread: null, mixes: false });
  });

  it("refuses a threshold of 0 or less; the default is 0.20 m (common practice)", () => {
    expect(() => verticalSpread([1, 2], 0)).toThrow(/more than 0/);
    expect(DEFAULT_LEVEL_SPREAD_CAUTION).toBe(0.2);
  });
});
