/**
 * `npm run bench -- plan`: the trench plan with 5,000 finds in Chromium (playwright-core + Debian chromium).
 * Starts the built app with its own seeded data folder, imports 5,000 finds into one new trench through
 * the total-station import, then measures
 *   - first paint: navigation start → the first frame with every find drawn (a performance mark the
 *     canvas sets), finds fetched over the JSON API included;
 *   - frame time while panning and while zooming: one synthetic pointer or wheel event per frame, frame
 *     rate limit off, so each requestAnimationFrame interval is the frame's whole cost. Two pans: a
 *     sweep within about 200 × 120 px of the start, and a wide one of ±380 × ±300 px. The plan copies
 *     its finds from a bitmap painted a margin (a third of the canvas) larger than the view, so the wide
 *     sweep includes the frames that repaint that bitmap each time the pan leaves it.
 *     Every zoom frame changes the scale and so draws every find afresh.
 * Prints a markdown table. Not a test: the figures depend on the machine.
 */
import { BENCH_TRENCH_RING, importBenchTrench, median, seeded, withBenchBrowser } from "./browser-bench";

const N = Number(process.env.BENCH_FINDS ?? 5000);
const RUNS = Number(process.env.BENCH_RUNS ?? 3);
const port = Number(process.env.BENCH_PORT ?? 3390);

/** Seeded points inside a 40 × 30 m trench with a 6 × 4 m baulk (Park–Miller minimal standard LCG). */
function points(n: number) {
  const rnd = seeded(20261201);
  const out: [number, number][] = [];
  while (out.length < n) {
    const x = rnd() * 40;
    const y = rnd() * 30;
    if (x > 17 && x < 23 && y > 13 && y < 17) continue;
    out.push([Number(x.toFixed(3)), Number(y.toFixed(3))]);
  }
  return out;
}

const p95 = (a: number[]) => [...a].sort((x, y) => x - y)[Math.floor(a.length * 0.95)];

const chromiumArgs = ["--disable-frame-rate-limit", "--disable-gpu-vsync"];
await withBenchBrowser("plan", { port, chromiumArgs }, async ({ browser, page, siteId }) => {
  const baulk = [
    [17, 13],
    [23, 13],
    [23, 17],
    [17, 17],
    [17, 13],
  ];
  const outline = { type: "Polygon" as const, coordinates: [BENCH_TRENCH_RING, baulk] };
  const { trenchId } = await importBenchTrench(
    page,
    siteId,
    { code: "BENCH", name: "Benchmark", outline },
    [9001, 9002, 9003],
    points(N),
  );

  const rows: string[][] = [];
  for (let run = 1; run <= RUNS; run++) {
    await page.goto(`/sites/${siteId}/trenches/${trenchId}`);
    await page.waitForFunction(() => performance.getEntriesByName("loamwork-plan-finds").length > 0, undefined, {
      timeout: 60_000,
    });
    const firstPaint = await page.evaluate(() => {
      const m = performance.getEntriesByName("loamwork-plan-finds")[0] as PerformanceMark;
      return { at: m.startTime, finds: m.detail as number };
    });
    const frames = await page.evaluate(async () => {
      const el = document.querySelector("[data-testid=plan-canvas]") as HTMLElement;
      const r = el.getBoundingClientRect();
      const cx = r.left + r.width / 2;
      const cy = r.top + r.height / 2;
      const opts = (x: number, y: number) => ({
        pointerId: 7,
        clientX: x,
        clientY: y,
        button: 0,
        buttons: 1,
        bubbles: true,
        pointerType: "mouse",
        isPrimary: true,
      });
      const run = (steps: number, act: (i: number) => void) =>
        new Promise<number[]>((resolve) => {
          const times: number[] = [];
          let last = 0;
          let i = 0;
          const frame = () => {
            const now = performance.now();
            if (i > 0) times.push(now - last);
            last = now;
            if (i === steps) return resolve(times);
            act(i++);
            requestAnimationFrame(frame);
          };
          requestAnimationFrame(frame);
        });
      // Frames with nothing to do: the machine's own floor under the current load.
      const idle = await run(120, () => undefined);
      el.dispatchEvent(new PointerEvent("pointerdown", opts(cx, cy)));
      const pan = await run(240, (i) =>
        el.dispatchEvent(
          new PointerEvent("pointermove", opts(cx + 200 * Math.sin(i / 20), cy + 120 * Math.cos(i / 25))),
        ),
      );
      el.dispatchEvent(new PointerEvent("pointerup", opts(cx, cy)));
      // The middle button pans wherever it starts (the sweep has moved the plan, so a find may be under cx).
      const middle = (x: number, y: number) => ({ ...opts(x, y), button: 1, buttons: 4 });
      el.dispatchEvent(new PointerEvent("pointerdown", middle(cx, cy)));
      const sweep = (i: number): [number, number] => [
        cx + 380 * Math.sin((2 * Math.PI * i) / 120),
        cy + 300 * Math.sin((2 * Math.PI * i) / 80),
      ];
      const wide = await run(240, (i) => el.dispatchEvent(new PointerEvent("pointermove", middle(...sweep(i + 1)))));
      el.dispatchEvent(new PointerEvent("pointerup", middle(...sweep(240))));
      const zoom = await run(240, (i) =>
        el.dispatchEvent(
          new WheelEvent("wheel", {
            deltaY: i % 60 < 30 ? -40 : 40,
            clientX: cx,
            clientY: cy,
            bubbles: true,
            cancelable: true,
          }),
        ),
      );
      return { idle, pan, wide, zoom };
    });
    rows.push([
      String(run),
      String(firstPaint.finds),
      firstPaint.at.toFixed(0),
      median(frames.idle).toFixed(2),
      median(frames.pan).toFixed(2),
      p95(frames.pan).toFixed(2),
      median(frames.wide).toFixed(2),
      p95(frames.wide).toFixed(2),
      median(frames.zoom).toFixed(2),
      p95(frames.zoom).toFixed(2),
    ]);
  }
  const version = browser.version();
  const load = (await import("node:os")).loadavg()[0].toFixed(1);
  console.log(
    `\nTrench plan, ${N} finds, Chromium ${version}, 1366 × 900, ${RUNS} runs, load average ${load} on ${(await import("node:os")).cpus().length} CPUs\n`,
  );
  console.log(
    "| run | finds drawn | first paint (ms) | idle frame median (ms) | pan median (ms) | pan p95 (ms) | wide pan median (ms) | wide pan p95 (ms) | zoom median (ms) | zoom p95 (ms) |",
  );
  console.log("| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |");
  for (const r of rows) console.log(`| ${r.join(" | ")} |`);
});
