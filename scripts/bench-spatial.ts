/**
 * `npm run bench -- spatial [--quick]`: the engine benchmark of issue 3. For n = 200, 1000, 5000 uniform
 * points in the demo trench (demo-window.ts: L-shaped, with a baulk), each n in its own child process so
 * that peak memory is per n:
 * - one isotropic K (k-function.ts, the estimator used on observed data), and the simulation-loop kernel;
 * - a 999-simulation global envelope test on L (isotropic, MAD, CSR) through runDistributionTest on a warm
 *   two-thread pool (pool start-up timed apart), the per-simulation cost, and the share of the kernel's
 *   time spent enumerating pairs (the floor: what is left if the weights were free);
 * - where one simulation's time goes (CPU, one thread): drawing the points, sorting them into cells,
 *   preparing each point's edge slots, enumerating pairs, distances and binning, and the edge weights;
 * - the same test with the translation correction (999 simulations up to n = 1000, or with --quick at n = 200
 *   only; beyond, 99 or 19, scaled),
 *   the translation kernel per call (WebAssembly and TypeScript), where its time goes, and the once-per-run
 *   preparation of the window's set covariance;
 * - when Rscript with spatstat is installed, the same work in spatstat with fewer simulations, scaled
 *   per simulation, and the ratio.
 * `--big` adds n = 20,000 (a whole occupation floor): the isotropic test only, with its peak memory.
 * Writes the markdown table to stdout and to bench/results-spatial.md.
 */
import { execFileSync, spawnSync } from "node:child_process";
import { appendFileSync, mkdirSync, writeFileSync } from "node:fs";
import { availableParallelism, cpus, loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import {
  DEMO_TRENCH,
  kFunction,
  createIsotropicL,
  createRandom,
  defaultRGrid,
  runDistributionTest,
  createWindowSampler,
  ENGINE_VERSION,
  createWindow,
} from "../lib/spatial";
import { createSetCovarianceTable } from "../lib/spatial/geometry/set-covariance-table";
import { createTranslationL } from "../lib/spatial/kernel/l-translation";
import { pointwiseEnvelope, rankForLevel } from "../lib/spatial/envelopes/envelope";
import { globalTest } from "../lib/spatial/envelopes/global-test";
import { createSimulationPool } from "../lib/server/jobs/thread-pool";

const NSIM = 999;
const quick = process.argv.includes("--quick");
const big = process.argv.includes("--big");

/**
 * CPU milliseconds per call (user + system of this process, which has no other busy thread while it is
 * measured): steadier than wall time when other work shares the machine.
 */
function timeIt(reps: number, f: () => void): number {
  // warm up first, so that the optimising compiler has run before the clock starts
  for (let k = 0; k < reps; k++) f();
  const c0 = process.cpuUsage();
  for (let k = 0; k < reps; k++) f();
  const c = process.cpuUsage(c0);
  return (c.user + c.system) / 1000 / reps;
}

/** Milliseconds as a table cell; a part not measured at this n (null in the JSON line) as a dash. */
const ms = (v: number | null | undefined, digits: number): string =>
  typeof v === "number" && Number.isFinite(v) ? `${v.toFixed(digits)} ms` : "–";

/** Child mode: measure one n and print a JSON line. */
async function measure(n: number): Promise<void> {
  const win = createWindow(DEMO_TRENCH);
  const x = new Float64Array(n),
    y = new Float64Array(n);
  createWindowSampler(win).fill(createRandom(2024), n, x, y);
  const r = defaultRGrid(win, n);
  const reps = n >= 20000 ? 2 : n >= 5000 ? 5 : n >= 1000 ? 40 : 200;
  const kMs = n >= 20000 ? NaN : timeIt(reps, () => kFunction(win, { x, y }, { r, correction: "isotropic" }));
  const est = createIsotropicL(win, r);
  if (est.kernel !== "wasm" || !est.part) throw new Error("the WebAssembly kernel did not load");
  const estTs = createIsotropicL(win, r, { kernel: "typescript" });
  const out = new Float64Array(r.length);
  const kernelMs = timeIt(reps, () => est.l(x, y, n, out));
  const kernelTsMs = n >= 20000 ? NaN : timeIt(reps, () => estTs.l(x, y, n, out));
  const pairMs = timeIt(reps, () => est.countPairs(x, y, n));
  const pairs = est.countPairs(x, y, n);
  // where one simulation's time goes: each part timed with the parts before it, the differences reported
  const part = est.part;
  const sx = new Float64Array(n),
    sy = new Float64Array(n);
  let stream = 0;
  const sampler = createWindowSampler(win);
  const profile = {
    sample: timeIt(reps, () => sampler.fill(createRandom(5, stream++), n, sx, sy)),
    bucket: timeIt(reps, () => part(x, y, n, "bucket")),
    prepare: timeIt(reps, () => part(x, y, n, "prepare")),
    bins: timeIt(reps, () => part(x, y, n, "bins")),
  };
  const breakdown = {
    sample: profile.sample,
    bucket: profile.bucket,
    prepare: profile.prepare - profile.bucket,
    enumerate: pairMs - profile.bucket,
    bins: profile.bins - pairMs,
    weights: kernelMs - profile.prepare - (profile.bins - profile.bucket),
  };
  // the translation correction's kernel (set covariance looked up per pair) and its preparation, once per run
  const tc = process.cpuUsage();
  const table = createSetCovarianceTable(win, r[r.length - 1]);
  const tcu = process.cpuUsage(tc);
  const tableMs = (tcu.user + tcu.system) / 1000;
  const estTr = createTranslationL(win, r, table);
  const estTrTs = createTranslationL(win, r, table, { kernel: "typescript" });
  if (!estTr || !estTrTs) throw new Error("the set covariance was not prepared");
  if (estTr.kernel !== "wasm") throw new Error("the WebAssembly translation pass did not load");
  const translationKernelMs = timeIt(reps, () => estTr.l(x, y, n, out));
  const translationKernelTsMs = timeIt(reps, () => estTrTs.l(x, y, n, out));
  // the translation pass taken apart as the isotropic one: sort, enumerate, distances + bins; the rest is
  // the look-ups in the set covariance
  const trPart = {
    bucket: timeIt(reps, () => estTr.part(x, y, n, "bucket")),
    count: timeIt(reps, () => estTr.part(x, y, n, "count")),
    bins: timeIt(reps, () => estTr.part(x, y, n, "bins")),
  };
  const translationBreakdown = {
    bucket: trPart.bucket,
    enumerate: trPart.count - trPart.bucket,
    bins: trPart.bins - trPart.count,
    lookups: translationKernelMs - trPart.bins,
  };
  // the band: after the simulations, a test's pointwise envelope and MAD global test over 999 curves of m
  // values (their cost depends on 999 × m, not on n): the observed L and 999 simulated curves of this window
  const bandSims = new Float64Array(NSIM * r.length);
  const bandRandom = createRandom(7);
  for (let i = 0; i < NSIM; i++)
    for (let k = 0; k < r.length; k++) bandSims[i * r.length + k] = out[k] + 0.01 * (bandRandom.next() - 0.5);
  const bandSet = { m: r.length, s: NSIM, sims: bandSims };
  const theory = Float64Array.from(r);
  const bandMs = timeIt(n >= 20000 ? 2 : 5, () => {
    pointwiseEnvelope(bandSet, rankForLevel(NSIM, 0.05));
    globalTest(out, bandSet, r, { statistic: "mad", theory, rng: createRandom(8) });
  });
  const t0 = performance.now();
  const pool = createSimulationPool({ threads: 2 });
  const points = Array.from(x, (v, k) => ({ x: v, y: y[k] }));
  const spec = { window: DEMO_TRENCH, points, seed: 1, nsim: 19, tests: [{ type: "l-envelope", statistic: "mad" }] };
  await runDistributionTest(spec, { pool }); // warm: threads started, worker code compiled
  const startupMs = performance.now() - t0;
  const nsim = quick && n >= 5000 ? 99 : NSIM;
  const load = loadavg()[0];
  const c1 = process.cpuUsage();
  const t1 = performance.now();
  const res = await runDistributionTest({ ...spec, nsim }, { pool });
  const testMs = performance.now() - t1;
  // user + system time of every thread of this process (main and workers)
  const cpu = process.cpuUsage(c1);
  const testCpuMs = (cpu.user + cpu.system) / 1000;
  // the translation correction: the same test (fewer simulations beyond n = 1000, scaled per simulation)
  let translation: { nsim: number; ms: number; cpuMs: number } | null = null;
  if (n < 20000) {
    const tNsim = n <= (quick ? 200 : 1000) ? NSIM : n <= 1000 ? 99 : 19;
    const c2 = process.cpuUsage();
    const t2 = performance.now();
    await runDistributionTest(
      { ...spec, nsim: tNsim, tests: [{ type: "l-envelope", statistic: "mad", correction: "translation" }] },
      { pool },
    );
    const cpu2 = process.cpuUsage(c2);
    translation = { nsim: tNsim, ms: performance.now() - t2, cpuMs: (cpu2.user + cpu2.system) / 1000 };
  }
  await pool.destroy();
  const csv = join(tmpdir(), `loamwork-bench-${n}.csv`);
  writeFileSync(csv, `x,y\n${Array.from(x, (v, k) => `${v},${y[k]}`).join("\n")}\n`);
  const maxRssMb = process.resourceUsage().maxRSS / 1024;
  process.stdout.write(
    `${JSON.stringify({ n, m: r.length, rmax: r[r.length - 1], pairs, kMs, kernelMs, kernelTsMs, pairMs, breakdown, bandMs, translation, tableMs, translationKernelMs, translationKernelTsMs, translationBreakdown, startupMs, nsim, testMs, testCpuMs, load, p: res.results[0].pValue, maxRssMb, csv })}\n`,
  );
}

function spatstat(
  csv: string,
  nsim: number,
): { k: number; test: number; nsim: number; spatstat: string; p: number } | null {
  try {
    const outText = execFileSync("Rscript", [join(import.meta.dirname, "bench-spatial-r.R"), csv, String(nsim)], {
      encoding: "utf8",
      stdio: ["ignore", "pipe", "ignore"],
      timeout: 900_000,
    });
    return JSON.parse(outText.trim().split("\n").pop()!);
  } catch {
    return null;
  }
}

async function main(): Promise<void> {
  const child = process.argv.find((a) => a.startsWith("--n="));
  if (child) return measure(Number(child.slice(4)));
  const rows: string[] = [];
  const profileRows: string[] = [];
  const notes: string[] = [];
  let spatstatVersion = "";
  for (const n of big ? [200, 1000, 5000, 20000] : [200, 1000, 5000]) {
    const run = spawnSync(
      process.execPath,
      ["--import", "tsx", import.meta.filename, `--n=${n}`, ...(quick ? ["--quick"] : [])],
      { encoding: "utf8", maxBuffer: 1 << 26 },
    );
    if (run.status !== 0) throw new Error(`bench for n = ${n} failed: ${run.stderr}`);
    const m = JSON.parse(run.stdout.trim().split("\n").pop()!);
    // kept as it comes, so that a long run stopped part-way still leaves its finished rows
    mkdirSync(join(import.meta.dirname, "..", "bench"), { recursive: true });
    appendFileSync(
      join(import.meta.dirname, "..", "bench", "results-spatial-raw.jsonl"),
      `${JSON.stringify({ at: new Date().toISOString(), ...m })}\n`,
    );
    const perSim = m.testMs / m.nsim;
    const rNsim = n <= 200 ? 39 : n <= 1000 ? 19 : 4;
    const R = n >= 20000 ? null : spatstat(m.csv, rNsim);
    let rCols = n >= 20000 ? "not run | – | –" : "not installed | – | –";
    if (R) {
      spatstatVersion = R.spatstat;
      const rPerSim = R.test / R.nsim;
      rCols = `${R.k.toFixed(3)} s | ${(rPerSim * NSIM).toFixed(0)} s (${R.nsim} sims, scaled ×${(NSIM / R.nsim).toFixed(1)}) | ${((rPerSim * NSIM) / ((perSim * NSIM) / 1000)).toFixed(0)}×`;
    }
    rows.push(
      `| ${n} | ${m.pairs} | ${ms(m.kMs, 1)} | ${ms(m.kernelMs, 2)} | ${ms(m.kernelTsMs, 2)} | ${(m.testMs / 1000).toFixed(2)} s${m.nsim !== NSIM ? ` (${m.nsim} sims)` : ""} | ${(m.testCpuMs / 1000).toFixed(2)} s | ${m.load.toFixed(1)} | ${perSim.toFixed(2)} ms | ${((100 * m.pairMs) / m.kernelMs).toFixed(0)} % | ${m.maxRssMb.toFixed(0)} MB | ${(m.startupMs / 1000).toFixed(2)} s | ${rCols} |`,
    );
    const b = m.breakdown as Record<"sample" | "bucket" | "prepare" | "enumerate" | "bins" | "weights", number>;
    const total = b.sample + m.kernelMs;
    const pc = (v: number) => `${v.toFixed(2)} ms (${((100 * v) / total).toFixed(0)} %)`;
    const tr = m.translation as { nsim: number; ms: number; cpuMs: number } | null;
    const trCol = tr
      ? `${(((tr.ms / tr.nsim) * NSIM) / 1000).toFixed(1)} s${tr.nsim !== NSIM ? ` (${tr.nsim} sims, scaled)` : ""} · ${(tr.cpuMs / tr.nsim).toFixed(2)} ms CPU/sim`
      : "not run";
    const tb = m.translationBreakdown as Record<"bucket" | "enumerate" | "bins" | "lookups", number>;
    const trKernel = `${ms(m.translationKernelMs, 2)} (TypeScript ${ms(m.translationKernelTsMs, 2)}) · ${ms(m.tableMs, 0)}`;
    const trParts = `${tb.bucket.toFixed(2)} / ${tb.enumerate.toFixed(2)} / ${tb.bins.toFixed(2)} / ${tb.lookups.toFixed(2)} ms`;
    profileRows.push(
      `| ${n} | ${pc(b.sample)} | ${pc(b.bucket)} | ${pc(b.prepare)} | ${pc(b.enumerate)} | ${pc(b.bins)} | ${pc(b.weights)} | ${total.toFixed(2)} ms | ${ms(m.bandMs, 1)} | ${(m.testCpuMs / m.nsim).toFixed(2)} ms | ${trKernel} | ${trParts} | ${trCol} |`,
    );
    process.stderr.write(`n = ${n} done\n`);
  }
  notes.push(
    `Engine ${ENGINE_VERSION}; Node ${process.version}; ${availableParallelism()} cores (${cpus()[0]?.model ?? "unknown CPU"}); ${new Date().toISOString().slice(0, 16)} UTC.`,
    "Points: uniform in the demo trench (about 12 m × 8 m, L-shaped, with a 2 m × 0.8 m baulk), seed 2024; r grid: spatstat's default (513 values, r max = min(short side/4, √(1000/(πλ)))).",
    "K: one isotropic K̂ by k-function.ts (kdbush pairs, exact Math.acos weights), the estimator of observed data; kernel: the simulation loop's fused estimator (grid pairs + weights + bins, l-isotropic.ts), as run in the test — the WebAssembly scan (asm/isotropic-scan.ts, SIMD) — and its TypeScript loop for comparison; all as CPU time per call over repeated calls.",
    `Test: runDistributionTest, L under CSR (Poisson n), isotropic, MAD, ${NSIM} simulations on a warm 2-thread pool; pool start-up (threads + loading the TypeScript worker) is timed separately and not included.`,
    "Load avg: the 1-minute load average when the test started (other work on the machine); with load well above the 2 cores, wall times stretch and the CPU column (main thread + both workers) is the steadier figure.",
    "Pair enumeration share: the WebAssembly scan enumerating pairs alone (same grid and stencil, no weights or bins; CPU) over the whole WebAssembly kernel (CPU) — the floor if edge weights cost nothing.",
    "Peak memory: maxRSS of the process (main thread + workers) over the whole measurement of that n.",
    spatstatVersion
      ? `spatstat ${spatstatVersion}: Kest(correction = "isotropic") and mad.test(X, Lest, correction = "isotropic") on the same points and window, in the same run (wall time, so equally exposed to the load), with fewer simulations scaled to ${NSIM}; R is single-threaded. Ratio: spatstat's scaled test time over the engine's wall time.`
      : "spatstat: Rscript with spatstat was not found, so no ratio was measured.",
  );
  const table = [
    "| n | pairs ≤ r max | one K (isotropic, CPU) | kernel K (CPU, WebAssembly) | kernel K (CPU, TypeScript) | 999-sim L test (wall) | test CPU (all threads) | load avg | per sim (wall) | pair enumeration share | peak RSS | pool start-up | spatstat K | spatstat 999-sim test | ratio (test) |",
    "| ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |",
    ...rows,
  ].join("\n");
  const profile = [
    "| n | draw points | sort into cells | edge slots | pair enumeration | distances + bins | edge weights | one simulation (CPU, one thread) | band and global test, once per test (CPU) | per simulation in the test (CPU, all threads) | translation kernel (CPU, one thread, WebAssembly) · set covariance prepared (once per run) | translation kernel: sort / enumerate / distances + bins / look-ups | translation correction: 999-sim test (wall) |",
    "| ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |",
    ...profileRows,
  ].join("\n");
  notes.push(
    "Profile: one simulation of the isotropic L test taken apart (CPU per call, one thread, repeated calls): draw n uniform points in the trench; sort them into the cell grid; each point's edge slots (edges nearer than r max, their angles); enumerate pairs within r max; each pair's distance, bin and histogram entry at unit weight; the rest of the kernel — Ripley's isotropic weight of both ends of every pair whose circle leaves the trench. The parts are differences of cumulative timings, so small ones carry the timer's noise. Band: once per test, after its simulations, the pointwise envelope (rank for 5 %) and the MAD global test over 999 curves of the grid's 513 values (a cost of 999 × 513, whatever n).",
    "Translation: the same test with the translation correction on the same warm pool; 999 simulations up to n = 1000 (with --quick: at n = 200, 99 at n = 1000), 19 beyond, scaled per simulation. Each pair's weight |W| / |W ∩ (W + v)| is looked up in the window's set covariance, prepared once per run and thread (set-covariance-table.ts: a quadratic per cell of v, plus the few edge pairs whose case changes inside the cell), in the pass that enumerates and bins the pairs (l-translation.ts, run as WebAssembly: asm/translation-scan.ts); the same sums as the exact polygon overlap of edge-translation.ts to rounding. Translation kernel: that pass alone, CPU per call (the TypeScript pass beside it), taken apart as differences of cumulative timings; preparation: CPU, once.",
  );
  const md = `# Spatial engine benchmark\n\n${table}\n\n## Where one simulation's time goes\n\n${profile}\n\n${notes.map((n) => `- ${n}`).join("\n")}\n`;
  mkdirSync(join(import.meta.dirname, "..", "bench"), { recursive: true });
  writeFileSync(join(import.meta.dirname, "..", "bench", "results-spatial.md"), md);
  process.stdout.write(md);
}

await main();
