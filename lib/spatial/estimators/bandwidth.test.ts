import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { createWindow } from "../geometry/window";
import { diggleBandwidth } from "./bandwidth";
import { scottBandwidth, intensityAtPoints } from "./intensity";

/** Coordinates of spatstat's open datasets, as stored with the reference fixtures. */
function dataset(name: string) {
  const file = path.join(__dirname, "..", "..", "..", "tests", "reference", "fixtures", `dataset-${name}.json`);
  const fx = JSON.parse(readFileSync(file, "utf8"));
  return {
    window: createWindow({ outer: fx.window.outer, holes: fx.window.holes }),
    points: { x: Float64Array.from(fx.points.x as number[]), y: Float64Array.from(fx.points.y as number[]) },
  };
}

describe("bandwidth rules", () => {
  // Expected values: spatstat 3.0.3 (spatstat.explore 3.0.6, R 4.2.2), bw.diggle(X, correction =
  // "isotropic") and bw.scott.iso(X), run by hand on the redwood (Strauss 1975; Ripley 1977) and
  // japanesepines (Numata 1961) datasets of spatstat.data 3.0.0.
  it("Berman–Diggle cross-validation equals spatstat's bw.diggle", () => {
    const redwood = dataset("redwood");
    const pines = dataset("japanesepines");
    expect(diggleBandwidth(redwood.window, redwood.points).sigma).toBeCloseTo(0.0225048923679061, 12);
    expect(diggleBandwidth(pines.window, pines.points).sigma).toBeCloseTo(0.0587084148727984, 12);
  });

  it("Scott's rule equals spatstat's bw.scott.iso", () => {
    expect(scottBandwidth(dataset("redwood").points)).toBeCloseTo(0.137029873862326, 12);
    expect(scottBandwidth(dataset("japanesepines").points)).toBeCloseTo(0.148987117568991, 12);
  });

  it("is chosen by name in the intensity options", () => {
    const { window, points } = dataset("redwood");
    expect(intensityAtPoints(window, points, { sigma: "diggle" }).sigma).toBeCloseTo(0.0225048923679061, 12);
  });

  it("the criterion is +∞ at h = 0 and finite elsewhere", () => {
    const { window, points } = dataset("japanesepines");
    const d = diggleBandwidth(window, points);
    expect(d.M[0]).toBe(Infinity);
    expect(Array.from(d.M.subarray(1)).every(Number.isFinite)).toBe(true);
    expect(d.h.length).toBe(d.M.length);
  });
});
