import { afterAll, describe, expect, test } from "vitest";
import {
  createWindow,
  DEMO_TRENCH,
  defaultRGrid,
  runDistributionTest,
  runSimulations,
  type SimSetup,
} from "@/lib/spatial";
import { createSimulationPool } from "./thread-pool";

const r = Array.from(defaultRGrid(createWindow(DEMO_TRENCH), 200, { count: 65 }));
const setup: SimSetup = {
  window: DEMO_TRENCH,
  r,
  model: { kind: "csr-l", n: 200, count: "poisson", correction: "isotropic" },
};
const one = createSimulationPool({ threads: 1 });
const two = createSimulationPool({ threads: 2 });
afterAll(async () => {
  await Promise.all([one.destroy(), two.destroy()]);
});

describe("simulation pool", () => {
  test("the same seed gives identical curves in this thread, on 1 worker and on 2 workers", async () => {
    const opts = { seed: 99, streamBase: 1, nsim: 40 };
    const local = await runSimulations(setup, { ...opts, pool: null });
    const a = await runSimulations(setup, { ...opts, pool: one, chunks: 3 });
    const b = await runSimulations(setup, { ...opts, pool: two, chunks: 7 });
    expect(local.m).toBe(r.length);
    expect(Array.from(a.sims)).toEqual(Array.from(local.sims));
    expect(Array.from(b.sims)).toEqual(Array.from(local.sims));
    const other = await runSimulations(setup, { ...opts, seed: 100, pool: two });
    expect(Array.from(other.sims)).not.toEqual(Array.from(local.sims));
  });

  test("progress rises to exactly 1", async () => {
    const seen: number[] = [];
    await runSimulations(setup, { seed: 1, streamBase: 1, nsim: 30, pool: two, onProgress: (f) => seen.push(f) });
    expect(seen.length).toBeGreaterThan(1);
    expect(seen[seen.length - 1]).toBe(1);
    // Strictly rising: no value twice, and already in ascending order.
    expect(new Set(seen).size).toBe(seen.length);
    expect(seen).toEqual([...seen].sort((a, b) => a - b));
  });

  test("an abort stops the run and rejects with an AbortError, in a worker and in this thread", async () => {
    // 4000 simulations of 1500 points would take minutes; the run is aborted at its first progress report
    const big: SimSetup = { ...setup, model: { kind: "csr-l", n: 1500, count: "fixed", correction: "isotropic" } };
    for (const pool of [two, null]) {
      const controller = new AbortController();
      let reports = 0;
      const run = runSimulations(big, {
        seed: 1,
        streamBase: 1,
        nsim: 4000,
        pool,
        chunks: 400,
        signal: controller.signal,
        onProgress: () => {
          reports++;
          controller.abort();
        },
      });
      await expect(run).rejects.toMatchObject({ name: "AbortError" });
      expect(reports).toBeLessThan(10);
    }
    // the pool still works after a cancelled run (its threads were never stopped)
    const after = await runSimulations(setup, { seed: 99, streamBase: 1, nsim: 4, pool: two });
    expect(after.s).toBe(4);
  }, 60_000);

  test("a run given a pool factory starts its own threads and gives the numbers of a run in this thread", async () => {
    const points = Array.from({ length: 60 }, (_, k) => ({ x: 1 + (k % 10) * 1.1, y: 1 + Math.floor(k / 10) * 0.9 }));
    const window = {
      outer: [
        [0, 0],
        [12, 0],
        [12, 7],
        [0, 7],
      ] as [number, number][],
    };
    const spec = { window, points, nsim: 19, seed: 3, r: { count: 33 }, tests: [{ type: "l-envelope" as const }] };
    const asked: (number | undefined)[] = [];
    const threaded = await runDistributionTest(
      { ...spec, workers: 2 },
      {
        createPool: (threads) => {
          asked.push(threads);
          return createSimulationPool({ threads });
        },
      },
    );
    const local = await runDistributionTest(
      { ...spec, workers: 0 },
      {
        createPool: () => {
          throw new Error("no pool for workers: 0");
        },
      },
    );
    expect(asked).toEqual([2]);
    expect(threaded.results.map((t) => t.pValue)).toEqual(local.results.map((t) => t.pValue));
    expect(threaded.results.map((t) => t.curves)).toEqual(local.results.map((t) => t.curves));
  });

  test("an input error inside a worker comes back as a clear error", async () => {
    const bad: SimSetup = {
      ...setup,
      model: { kind: "inhom-l", lambda: { nx: 1, ny: 1, minX: 0, minY: 0, dx: 20, dy: 20, values: [Number.NaN] } },
    };
    await expect(runSimulations(bad, { seed: 1, streamBase: 1, nsim: 2, pool: two })).rejects.toThrow(
      /intensity value is NaN/,
    );
  });
});
