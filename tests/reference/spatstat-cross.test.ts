/**
 * Between two classes against spatstat: Kcross / Lcross (isotropic, circle on the first class), Kdot and
 * each class's own K in the whole window (the terms of the K difference), to a relative 1e-6. Fixtures:
 * trench-*-{together,apart}.json (invented trench patterns, see make-fixtures.R) and dataset-amacrine.json
 * (Hughes' amacrine cells, Diggle 1986, J. Neurosci. Meth. 18:115–125).
 */
import { describe, expect, it } from "vitest";
import { createWindow, crossK, dotK, kDifference } from "@/lib/spatial";
import { classPoints, expectCurve, fixtureFiles, loadFixture, source, type Fixture } from "./fixture";

const curve = (fx: Fixture, key: string) => fx.cross![key] as (number | null)[];
const call = (fx: Fixture, key: string) => fx.cross![key] as string;

const files = fixtureFiles("trench-").filter((f) => /-(together|apart)\.json$/.test(f));

describe.each(files)("spatstat two-class reference %s", (file) => {
  const fx = loadFixture(file);
  const W = createWindow({ outer: fx.window.outer, holes: fx.window.holes });
  const A = classPoints(fx, "A");
  const B = classPoints(fx, "B");

  it("has spatstat's Kcross and Lcross both ways", () => {
    const ab = crossK(W, A, B, { r: fx.r, correction: "isotropic" });
    expectCurve(ab.K.isotropic!, curve(fx, "KcrossAB"), source(fx, call(fx, "callKcrossAB")));
    expectCurve(ab.L.isotropic!, curve(fx, "LcrossAB"), source(fx, "sqrt(" + call(fx, "callKcrossAB") + "$iso / pi)"));
    const ba = crossK(W, B, A, { r: fx.r, correction: "isotropic" });
    expectCurve(ba.K.isotropic!, curve(fx, "KcrossBA"), source(fx, call(fx, "callKcrossBA")));
  });

  it("has spatstat's Kdot for class A", () => {
    const isA = fx.points.marks!.map((m) => m === "A");
    const dot = dotK(W, { x: fx.points.x, y: fx.points.y }, isA, { r: fx.r, correction: "isotropic" });
    expectCurve(dot.K.isotropic!, curve(fx, "KdotA"), source(fx, call(fx, "callKdotA")));
  });

  it("has spatstat's K of each class, the terms of the K difference", () => {
    const d = kDifference(W, A, B, { r: fx.r, correction: "isotropic" });
    expectCurve(d.KAA.isotropic!, curve(fx, "KAA"), source(fx, call(fx, "callKAA")));
    expectCurve(d.KBB.isotropic!, curve(fx, "KBB"), source(fx, call(fx, "callKBB")));
  });

  it("reads the designed relation: together above CSR at 1 m, apart below", () => {
    const k = fx.r.indexOf(1);
    const L = crossK(W, A, B, { r: fx.r, correction: "isotropic" }).L.isotropic![k];
    // spatstat's Lcross at r = 1 m in the same fixture gives the same side of the CSR value r.
    const ref = curve(fx, "LcrossAB")[k]!;
    expect(L > 1, source(fx, call(fx, "callKcrossAB"))).toBe(ref > 1);
    expect(ref > 1).toBe(file.includes("together"));
  });
});

describe("spatstat two-class reference dataset-amacrine.json", () => {
  const fx = loadFixture("dataset-amacrine.json");
  const W = createWindow({ outer: fx.window.outer, holes: fx.window.holes });
  it("has spatstat's Kcross between on and off cells both ways", () => {
    const on = classPoints(fx, "on");
    const off = classPoints(fx, "off");
    const a = crossK(W, on, off, { r: fx.r, correction: "isotropic" });
    expectCurve(a.K.isotropic!, curve(fx, "KcrossOnOff"), source(fx, call(fx, "callKcrossOnOff")));
    const b = crossK(W, off, on, { r: fx.r, correction: "isotropic" });
    expectCurve(b.K.isotropic!, curve(fx, "KcrossOffOn"), source(fx, call(fx, "callKcrossOffOn")));
  });
});
