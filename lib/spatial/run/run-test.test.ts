import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { createRandom } from "../random/random";
import { parseRunSpec } from "./run-spec";
import { runDistributionTest } from "./run-test";
import { createWindowSampler } from "../random/sample-window";
import { createWindow } from "../geometry/window";

const win = createWindow(DEMO_TRENCH);

/** Thomas-like clusters: parents uniform in W, offspring normal (sd σ) around them, kept if inside W. */
function clustered(seed: number, parents: number, perParent: number, sigma: number, classes = ["A"]) {
  const rng = createRandom(seed);
  const sampler = createWindowSampler(win);
  const px = new Float64Array(parents),
    py = new Float64Array(parents);
  sampler.fill(rng, parents, px, py);
  const pts: { x: number; y: number; cls: string }[] = [];
  for (let p = 0; p < parents; p++) {
    for (let k = 0; k < perParent; k++) {
      // Box–Muller normal offsets
      const u = 1 - rng.next(),
        v = rng.next();
      const rad = sigma * Math.sqrt(-2 * Math.log(u));
      const x = px[p] + rad * Math.cos(2 * Math.PI * v),
        y = py[p] + rad * Math.sin(2 * Math.PI * v);
      if (win.contains(x, y)) pts.push({ x, y, cls: classes[rng.int(classes.length)] });
    }
  }
  return pts;
}

/** A jittered 0.7 m grid: as regular as finds laid out on purpose. */
function jitteredGrid(seed: number) {
  const rng = createRandom(seed);
  const pts: { x: number; y: number; cls: string }[] = [];
  for (let x = 0.35; x < 12.1; x += 0.7) {
    for (let y = 0.35; y < 8; y += 0.7) {
      const jx = x + (rng.next() - 0.5) * 0.1,
        jy = y + (rng.next() - 0.5) * 0.1;
      if (win.contains(jx, jy) && win.boundaryDistance(jx, jy) > 0.05) pts.push({ x: jx, y: jy, cls: "A" });
    }
  }
  return pts;
}

const base = { window: DEMO_TRENCH, nsim: 99, workers: 0, seed: 5 };

describe("runDistributionTest verdicts", () => {
  test("a clustered pattern comes out clustered, by L (MAD, DCLF, rank) and by Clark–Evans Monte Carlo", async () => {
    const points = clustered(1, 8, 12, 0.25);
    const res = await runDistributionTest({
      ...base,
      points,
      tests: [
        { type: "l-envelope" },
        { type: "l-envelope", statistic: "dclf", count: "fixed" },
        { type: "l-envelope", statistic: "rank" },
        { type: "clark-evans", correction: "monte-carlo" },
      ],
    });
    for (const r of res.results) {
      expect(r.verdict).toBe("clustered");
      expect(r.pValue).toBeLessThanOrEqual(0.05);
    }
    const ex = res.results[0].curves!.excursions;
    expect(ex[0].side).toBe("above");
    expect(res.results[0].nsim).toBe(99);
    expect(res.results[0].seed).toBe(5);
  });

  test("a jittered grid comes out evenly spread", async () => {
    const res = await runDistributionTest({
      ...base,
      points: jitteredGrid(2),
      tests: [{ type: "l-envelope" }, { type: "clark-evans", correction: "monte-carlo" }],
    });
    for (const r of res.results) expect(r.verdict).toBe("evenly spread");
    expect(res.results[0].curves!.excursions[0].side).toBe("below");
  });

  test("two classes from the same clusters: random labelling finds nothing, one class fixed finds attraction", async () => {
    const points = clustered(3, 6, 20, 0.3, ["A", "B"]);
    const res = await runDistributionTest({
      ...base,
      points,
      tests: [
        { type: "cross-l", a: "A", b: "B" },
        { type: "cross-l", a: "A", b: "B", null: "a-fixed" },
        { type: "k-difference", a: "A", b: "B" },
      ],
    });
    expect(res.results[0].verdict).toBe("no evidence against the null");
    expect(res.results[0].curves!.referenceKind).toBe("mean of simulations");
    expect(res.results[1].verdict).toBe("together");
    expect(res.results[2].verdict).toBe("no evidence against the null");
    expect(res.results[1].cautions.join(" ")).toMatch(/own clustering inflates/);
  });

  test("results carry version, seed and the general cautions; JSON round-trips without NaN", async () => {
    const res = await runDistributionTest({
      ...base,
      nsim: 19,
      points: clustered(4, 3, 5, 0.3),
      tests: [{ type: "l-envelope" }],
    });
    expect(res.engineVersion).toMatch(/^\d+\.\d+\.\d+$/);
    expect(res.cautions.length).toBe(4);
    const text = JSON.stringify(res);
    expect(text).not.toMatch(/NaN|null,null/);
    expect(res.results[0].cautions.join(" ")).toMatch(/little power/);
  });

  test("under CSR the global test's p-value is roughly uniform (300 seeded runs)", async () => {
    // 300 runs of 30 CSR points, 39 simulations each, fixed n: the MAD p-value is then exactly uniform on
    // {1/40, …, 40/40} (ties broken at random), so each of the 10 deciles has probability 1/10. Pearson X²
    // with 9 df: a correct engine exceeds 27.88 (the 0.999 quantile, standard χ² tables) once in 1000
    // seeds, while a biased one (say all p-values drift by one decile) gives X² in the hundreds.
    const counts = new Array(10).fill(0);
    const sampler = createWindowSampler(win);
    const x = new Float64Array(30),
      y = new Float64Array(30);
    for (let run = 0; run < 300; run++) {
      sampler.fill(createRandom(1000 + run), 30, x, y);
      const points = Array.from(x, (v, k) => ({ x: v, y: y[k] }));
      const res = await runDistributionTest({
        window: DEMO_TRENCH,
        points,
        nsim: 39,
        workers: 0,
        seed: run,
        r: { count: 33 },
        tests: [{ type: "l-envelope", count: "fixed" }],
      });
      counts[Math.min(9, Math.ceil(res.results[0].pValue * 10) - 1)]++;
    }
    const x2 = counts.reduce((s, o) => s + (o - 30) ** 2 / 30, 0);
    expect(x2).toBeLessThan(27.88);
  }, 60_000);
});

describe("bad input gives a clear error, never NaN", () => {
  const good = { ...base, points: clustered(6, 3, 6, 0.3), tests: [{ type: "l-envelope" }] };
  test.each([
    ["fewer than 2 points", { ...good, points: [{ x: 1, y: 1 }] }, /at least 2/],
    [
      "all points identical",
      {
        ...good,
        points: [
          { x: 1, y: 1 },
          { x: 1, y: 1 },
          { x: 1, y: 1 },
        ],
      },
      /same place/,
    ],
    ["a point outside the window", { ...good, points: [...good.points, { x: 11.9, y: 7 }] }, /outside the trench/],
    ["an r beyond the window", { ...good, r: [0, 5, 50] }, /beyond the trench/],
    [
      "a self-crossing outline",
      {
        ...good,
        window: {
          outer: [
            [0, 0],
            [4, 4],
            [4, 0],
            [0, 4],
          ],
        },
      },
      /crosses or touches itself/,
    ],
    ["a class with no points", { ...good, tests: [{ type: "l-envelope", class: "Z" }] }, /No find has class "Z"/],
    ["an unknown test", { ...good, tests: [{ type: "k-magic" }] }, /tests\.0\.type/],
    ["too few simulations", { ...good, nsim: 3 }, /nsim/],
  ])("%s", async (_name, spec, message) => {
    await expect(runDistributionTest(spec)).rejects.toThrow(message);
  });
});

describe("run descriptions are read strictly", () => {
  const points = [
    { x: 1, y: 1 },
    { x: 2, y: 1.5 },
    { x: 3, y: 2 },
  ];
  test("an unknown key is refused with its name and place, at the top and inside a test", () => {
    expect(() => parseRunSpec({ window: DEMO_TRENCH, points, nsims: 99, tests: [{ type: "l-envelope" }] })).toThrow(
      /input: Unrecognized key: "nsims"/,
    );
    expect(() =>
      parseRunSpec({ window: DEMO_TRENCH, points, tests: [{ type: "l-envelope", corection: "border" }] }),
    ).toThrow(/tests\.0: Unrecognized key: "corection"/);
    expect(() => parseRunSpec({ window: { ...DEMO_TRENCH, hole: [] }, points, tests: [{ type: "quadrat" }] })).toThrow(
      /window: Unrecognized key: "hole"/,
    );
    expect(() =>
      parseRunSpec({ window: DEMO_TRENCH, points: [{ x: 1, y: 1, class: "A" }], tests: [{ type: "quadrat" }] }),
    ).toThrow(/points\.0: Unrecognized key: "class"/);
  });

  test("a stored description is read as it was stored: unknown keys dropped, the rest as given", () => {
    const spec = parseRunSpec(
      { window: DEMO_TRENCH, points, note: "old", tests: [{ type: "l-envelope", correction: "border", legacy: 1 }] },
      { stored: true },
    );
    expect(spec.tests[0]).toEqual({ type: "l-envelope", correction: "border", count: "poisson", statistic: "mad" });
    expect("note" in spec).toBe(false);
  });
});
