/**
 * `npm run bench -- lattice`: the square-count benchmark of issue 16 — Moran's I with 9,999 permutations
 * and local Gi* with 999 conditional permutations per square, each on 2,000 squares (a 50 × 40 grid of
 * 1 m squares, queen contiguity on the grid, row-standardised weights, invented counts), single thread.
 * CPU and wall time of each call after one warm-up call, median of 5 runs, with the load average: on a
 * shared machine the CPU time is the steadier measure.
 */
import { cpus, loadavg } from "node:os";
import { buildLattice, createRandom, getisOrdStar, latticeWeights, moranI, type LatticeSquare } from "../lib/spatial";

const NX = 50;
const NY = 40;
const rng = createRandom(16);
const squares: LatticeSquare[] = [];
for (let r = 0; r < NY; r++) {
  for (let c = 0; c < NX; c++) {
    // counts rising towards one corner, with noise: sieved debitage, invented
    const mean = 3 + 6 * Math.exp(-((c - 10) ** 2 + (r - 30) ** 2) / 60);
    squares.push({ id: `E${c} N${r}`, col: c, row: r, area: 1, value: Math.floor(mean * 2 * rng.next()) });
  }
}
const lattice = buildLattice({ squares }, { neighbours: { type: "queen" } });
const w = latticeWeights(lattice.neighbours, "row");
const wStar = latticeWeights(lattice.neighbours, "row", true);

interface Timing {
  wall: number[];
  cpu: number[];
}

/** Wall and CPU (user + system of this single-threaded process) milliseconds of 5 runs after a warm-up. */
function time(f: () => void, runs = 5): Timing {
  f();
  const out: Timing = { wall: [], cpu: [] };
  for (let k = 0; k < runs; k++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    f();
    out.wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    out.cpu.push((c.user + c.system) / 1000);
  }
  return out;
}

const med = (v: number[]) => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)];
const sec = (ms: number) => (ms / 1000).toFixed(2);
const fmt = (t: Timing) =>
  `${sec(med(t.cpu))} s (${sec(Math.min(...t.cpu))}–${sec(Math.max(...t.cpu))}) | ${sec(med(t.wall))} s`;
const moran = time(() => moranI(lattice.values, w, { permutations: 9999, seed: 1 }));
const gi = time(() => getisOrdStar(lattice.values, wStar, { permutations: 999, seed: 1 }));
console.log(
  `Square-count tests, ${lattice.ids.length} squares, queen contiguity, row-standardised; ${cpus()[0].model}, Node ${process.version}, load average ${loadavg()[0].toFixed(1)}, ${new Date().toISOString()}`,
);
console.log("| test | CPU time, median of 5 (range) | wall time, median | target |");
console.log("| --- | ---: | ---: | ---: |");
console.log(`| Moran's I, 9,999 permutations | ${fmt(moran)} | under 1 s |`);
console.log(`| Getis–Ord Gi*, 999 conditional permutations per square | ${fmt(gi)} | under 1 s |`);
