import { describe, expect, it } from "vitest";
import { badgeWords, classSentence, pairSentence, squareSentence, withoutP } from "@/components/patterns/plain-words";
import type { ClassInScope } from "@/lib/api/run-result";
import type { SquareTestView } from "@/lib/patterns-view/square-view";
import type { CrossView, LView, TestView } from "@/lib/patterns-view/test-view";

const cls = (n: number): ClassInScope => ({
  id: "c1",
  code: "FLK",
  label: "Flint flake",
  colour: "#000",
  symbol: "disc",
  n,
});
const lTest = (verdict: TestView["verdict"], n: number, departures: LView["departures"] = []): LView => ({
  kind: "l-envelope",
  classId: "c1",
  n,
  verdict,
  sentence: "The finds are clustered at the 5 % level (p = 0.0100). Test: Besag's L, MAD test; seed 7.",
  p: 0.01,
  question: "",
  notes: [],
  statistic: "mad",
  count: "fixed",
  curve: { r: [], obs: [] },
  departures,
  clusterScale: null,
});
const cross = (verdict: TestView["verdict"], nA: number, nB: number, departures: CrossView["departures"] = []) =>
  ({
    kind: "cross-l",
    a: "a",
    b: "b",
    nA,
    nB,
    verdict,
    sentence: "",
    p: 0.2,
    question: "",
    notes: [],
    null: "random-labelling",
    curve: { r: [], obs: [] },
    departures,
  }) as CrossView;
const name = (id: string) => (id === "a" ? "Flint flake (FLK)" : "Burnt stone (BST)");
const everySentence = (n: number) =>
  (["clustered", "regular", "no-evidence"] as const).map((v) => classSentence(cls(n), [lTest(v, n)], 2));

describe("results in plain words", () => {
  it("a grouped class reads its rough group size from where the curve rejoins the band", () => {
    const s = classSentence(
      cls(150),
      [lTest("clustered", 150, [{ side: "above", from: 0.2, to: 1.52, rejoins: true }])],
      3,
    );
    expect(s).toBe("Flint flake (FLK) finds lie in groups, roughly up to 1.5 m across.");
  });

  it("a group that never rejoins the band gives no size", () => {
    const s = classSentence(
      cls(150),
      [lTest("clustered", 150, [{ side: "above", from: 0.2, to: 3, rejoins: false }])],
      3,
    );
    expect(s).toBe("Flint flake (FLK) finds lie in groups, closer together than chance would give.");
  });

  it("with too few finds says so, and never calls a layout random", () => {
    expect(classSentence(cls(12), [lTest("no-evidence", 12)], 2)).toContain("too few to tell (12)");
    expect(badgeWords(lTest("no-evidence", 12))).toBe("Too few to tell");
    expect(badgeWords(lTest("no-evidence", 150))).toBe("No clear pattern");
    expect(classSentence(cls(150), [lTest("no-evidence", 150)], 2)).toContain("show no clear pattern");
    for (const s of [...everySentence(12), ...everySentence(150)]) expect(s).not.toMatch(/random/i);
  });

  it("evenly spread, and tests that disagree, in words", () => {
    expect(classSentence(cls(80), [lTest("regular", 80)], 2)).toContain("spread more evenly than chance");
    const both = classSentence(
      cls(80),
      [
        lTest("regular", 80),
        { ...lTest("clustered", 80), kind: "pcf-envelope", bandwidth: 0.2 } as unknown as TestView,
      ],
      2,
    );
    expect(both).toContain("the tests disagree");
  });

  it("badges say the answer, not the statistics", () => {
    expect(badgeWords(lTest("clustered", 80))).toBe("Grouped together");
    expect(badgeWords(lTest("regular", 80))).toBe("Evenly spread");
    expect(badgeWords(cross("associated", 40, 40))).toBe("Found together");
    expect(badgeWords(cross("segregated", 40, 40))).toBe("Kept apart");
    for (const v of ["clustered", "regular", "no-evidence"] as const)
      expect(badgeWords(lTest(v, 80))).not.toMatch(/null|evidence|CSR/);
  });

  it("pairs: together within a rough distance, apart, which class is more grouped, too few", () => {
    expect(
      pairSentence(cross("associated", 40, 40, [{ side: "above", from: 0, to: 0.84, rejoins: true }]), name, 2),
    ).toBe(
      "Flint flake (FLK) and Burnt stone (BST) are found near each other more than chance would give, within roughly 0.84 m.",
    );
    expect(pairSentence(cross("segregated", 40, 40), name, 2)).toContain("keep apart");
    const kd = { ...cross("clustered", 40, 40), kind: "k-difference" } as CrossView;
    expect(pairSentence({ ...kd, departures: [{ side: "below", from: 0.1, to: 1, rejoins: true }] }, name, 2)).toBe(
      "Burnt stone (BST) finds are more tightly grouped than Flint flake (FLK) finds.",
    );
    expect(pairSentence(cross("no-evidence", 40, 8), name, 2)).toContain("too few to tell");
    expect(pairSentence(cross("no-evidence", 40, 40), name, 2)).toContain("no clear sign");
  });

  it("the detail line drops the p-value, which the card shows once", () => {
    const s = withoutP("No evidence against CSR at the 5 % level (p = 0.420). Test: Besag's L, MAD test; seed 7.");
    expect(s).toBe("No evidence against CSR at the 5 % level. Test: Besag's L, MAD test; seed 7.");
    expect(
      withoutP("Squares with similar values lie together at the 5 % level (p = 0.00100); I = 0.31 (Moran's I)."),
    ).not.toMatch(/p =/);
  });

  it("square-count tests in words, hot and cold spots counted", () => {
    const t = {
      verdict: "hot-spots",
      cells: [{ class: "hot spot" }, { class: "hot spot" }, { class: "cold spot" }, { class: "none" }],
    } as SquareTestView;
    expect(squareSentence(t, "Flint flake (FLK) finds")).toBe(
      "Flint flake (FLK) finds: 2 hot spots and 1 cold spot among the squares, more than chance would give.",
    );
    expect(squareSentence({ ...t, verdict: "no-evidence" }, "X")).toBe("X: no clear pattern in the counts by square.");
  });
});
