/**
 * What the browser benchmarks share: the built app on a seeded data folder of its own, Chromium, the director
 * signed in, and a trench of the demo site filled with finds through the total-station import.
 */
import path from "node:path";
import { rmSync } from "node:fs";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launchChromium } from "./chromium";
import { signInDemo } from "./sign-in-demo";
import { ensureBuilt, startStack, type Stack } from "./stack";

export type BenchBrowser = { stack: Stack; browser: Browser; context: BrowserContext; page: Page; siteId: string };

/**
 * Starts the built app on `.tmp/bench-<name>` (emptied first) and Chromium with `chromiumArgs`, signs the
 * director in on a 1366 × 900 page, and hands all of it to `run`; the browser and the app are stopped after
 * it, whatever happens.
 */
export async function withBenchBrowser(
  name: string,
  { port, chromiumArgs = [] }: { port: number; chromiumArgs?: readonly string[] },
  run: (bench: BenchBrowser) => Promise<void>,
): Promise<void> {
  ensureBuilt();
  const dataDir = path.join(".tmp", `bench-${name}`);
  rmSync(dataDir, { recursive: true, force: true });
  const stack = await startStack({ port, dataDir, quiet: true });
  const browser = await launchChromium(chromiumArgs);
  try {
    const context = await browser.newContext({ baseURL: stack.url, viewport: { width: 1366, height: 900 } });
    // tsx keeps function names with a `__name` helper that does not exist inside the page.
    await context.addInitScript({ content: "window.__name = (f) => f;" });
    const page = await context.newPage();
    await signInDemo(page, "director");
    const [site] = (await (await page.request.get("/api/sites")).json()) as { id: string }[];
    if (!site) throw new Error("the director has no site");
    await run({ stack, browser, context, page, siteId: site.id });
  } finally {
    await browser.close();
    await stack.stop();
  }
}

/** Park–Miller's minimal standard generator: numbers in (0, 1), the same for the same seed on every machine. */
export function seeded(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

export const median = (a: number[]) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)];

type Outline = { type: "Polygon"; coordinates: number[][][] };

/** The outer ring of the benchmarks' 40 × 30 m trench, in site-grid metres. */
export const BENCH_TRENCH_RING = [
  [0, 0],
  [40, 0],
  [40, 30],
  [0, 30],
  [0, 0],
];

/**
 * A new trench with `contexts` opened in it and `finds` (x, y in site-grid metres) imported: the site's
 * classes and the contexts each taken in turn. Throws, saying why, when a step is refused.
 */
export async function importBenchTrench(
  page: Page,
  siteId: string,
  trench: { code: string; name: string; outline: Outline },
  contexts: number[],
  finds: readonly (readonly [number, number])[],
) {
  const refused = async (what: string, res: { status(): number; text(): Promise<string> }) =>
    new Error(`${what} failed: ${res.status()} ${await res.text()}`);
  const madeTrench = await page.request.post(`/api/sites/${siteId}/trenches`, { data: trench });
  if (madeTrench.status() !== 201) throw await refused("the trench", madeTrench);
  const trenchId = ((await madeTrench.json()) as { id: string }).id;
  const contextIds: string[] = [];
  for (const number of contexts) {
    const made = await page.request.post(`/api/sites/${siteId}/contexts`, {
      data: { trenchId, number, type: "deposit" },
    });
    if (made.status() !== 201) throw await refused(`context ${number}`, made);
    contextIds.push(((await made.json()) as { id: string }).id);
  }
  const classes = (await (await page.request.get(`/api/sites/${siteId}/classes`)).json()) as {
    id: string;
    code: string;
  }[];
  const csv = [
    "x,y,class,context",
    ...finds.map(([x, y], i) => `${x},${y},${classes[i % classes.length].code},${contexts[i % contexts.length]}`),
  ].join("\n");
  const imported = await page.request.post(`/api/sites/${siteId}/import`, {
    data: { csv, fileName: "bench.csv", mapping: { x: "x", y: "y", classCode: "class", contextNumber: "context" } },
    timeout: 300_000,
  });
  if (imported.status() !== 201) throw await refused("the import", imported);
  return { trenchId, contextIds, classes };
}
