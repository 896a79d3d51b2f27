/**
 * `npm run bench -- offline` (build first with `npm run build`): what offline recording costs.
 *   - sync: 500 finds queued in an outbox (the device's own code, lib/offline, on fake-indexeddb in Node)
 *     sent to the built app in order, each with its idempotency key and a number from a held block;
 *   - offline reload: the trench plan with 5,000 finds, opened once online, reloaded in Chromium with the
 *     network off and the app server stopped: navigation start → every find drawn (the canvas's mark);
 *   - the service worker's caches after that one online visit: bytes per cache.
 * Prints a markdown table. Not a test: the figures depend on the machine.
 */
import "fake-indexeddb/auto";
import os from "node:os";
import type { Page } from "playwright-core";
import { ApiError, buildRequest, type ApiRequest } from "../lib/api/client";
import { Outbox } from "../lib/offline/outbox";
import { syncOutbox } from "../lib/offline/sync";
import { createWritePath } from "../lib/offline/write-path";
import { BENCH_TRENCH_RING, importBenchTrench, median, seeded, withBenchBrowser } from "./browser-bench";

const N = Number(process.env.BENCH_FINDS ?? 5000);
const QUEUED = Number(process.env.BENCH_QUEUED ?? 500);
const RUNS = Number(process.env.BENCH_RUNS ?? 3);
const port = Number(process.env.BENCH_PORT ?? 3392);

function points(n: number) {
  const rnd = seeded(20261203);
  return Array.from(
    { length: n },
    () => [Number((1 + rnd() * 38).toFixed(3)), Number((1 + rnd() * 28).toFixed(3))] as const,
  );
}

const rows: string[][] = [];
await withBenchBrowser("offline", { port }, async ({ stack, browser, context, page, siteId }) => {
  const outline = { type: "Polygon" as const, coordinates: [BENCH_TRENCH_RING] };
  const {
    trenchId,
    contextIds: [contextId],
    classes,
  } = await importBenchTrench(page, siteId, { code: "OFFB", name: "Offline benchmark", outline }, [9101], points(N));

  // 1. Sync of QUEUED finds, queued offline by the device's own write path.
  const cookie = (await context.cookies()).map((c) => `${c.name}=${c.value}`).join("; ");
  const send = async (req: ApiRequest) => {
    const res = await fetch(stack.url + req.url, {
      method: req.method,
      headers: { ...req.headers, cookie },
      body: req.body,
    });
    const body = await res.json().catch(() => null);
    if (!res.ok)
      throw new ApiError(body?.error ?? `status ${res.status}`, res.status, body?.fieldErrors ?? {}, {
        ...body?.details,
        reason: body?.code,
      });
    return body;
  };
  await send(buildRequest("siteUpdate", { siteId }, { numberBlockSize: QUEUED } as never));
  const block = (await send({
    operation: "numberBlocksCreate" as never,
    method: "POST",
    url: `/api/sites/${siteId}/number-blocks`,
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ kind: "find", deviceId: crypto.randomUUID() }),
  })) as { id: string; first: number; last: number };
  const outbox = await Outbox.open("bench");
  await outbox.putBlock({
    id: block.id,
    siteId,
    kind: "find",
    first: block.first,
    last: block.last,
    used: [],
  });
  const write = createWritePath({ outbox, online: () => false });
  for (const [i, [x, y]] of points(QUEUED).entries())
    await write(
      buildRequest(
        "findsCreate",
        { siteId },
        { contextId, classId: classes[i % classes.length].id, x, y, method: "plan" },
      ),
    );
  const t0 = performance.now();
  const out = await syncOutbox({ outbox, send });
  const syncMs = performance.now() - t0;
  if (out.sent !== QUEUED) throw new Error(`sync sent ${out.sent} of ${QUEUED}: ${JSON.stringify(out)}`);

  // 2. Offline reload of the plan with N + QUEUED finds, and 3. what the service worker keeps.
  const planUrl = `/sites/${siteId}/trenches/${trenchId}`;
  await page.goto(planUrl);
  await page.waitForFunction(() => Boolean(navigator.serviceWorker?.controller), null, { timeout: 30_000 });
  await page.waitForFunction(
    async (u) => Boolean(await (await caches.open("loamwork-pages")).match(u, { ignoreVary: true })),
    new URL(planUrl, stack.url).href,
    { timeout: 30_000 },
  );
  const cacheBytes = await cacheSizes(page);
  await stack.stopApp();
  await context.setOffline(true);
  const reloads: number[] = [];
  for (let run = 0; run < RUNS; run++) {
    await page.reload();
    await page.waitForFunction(() => performance.getEntriesByName("loamwork-plan-finds").length > 0, undefined, {
      timeout: 60_000,
    });
    reloads.push(await page.evaluate(() => performance.getEntriesByName("loamwork-plan-finds")[0].startTime));
  }
  rows.push([
    `sync of ${QUEUED} queued finds`,
    `${(syncMs / 1000).toFixed(1)} s (${(syncMs / QUEUED).toFixed(1)} ms a find)`,
  ]);
  rows.push([
    `offline reload of the plan, ${N + QUEUED} finds (median of ${RUNS})`,
    `${median(reloads).toFixed(0)} ms to every find drawn`,
  ]);
  for (const [name, bytes] of Object.entries(cacheBytes))
    rows.push([`service worker cache "${name}"`, `${(bytes / 1e6).toFixed(2)} MB`]);
  await context.setOffline(false);
  await stack.startApp();
  console.log(
    `\nOffline recording, Chromium ${browser.version()}, load average ${os.loadavg()[0].toFixed(1)} on ${os.cpus().length} CPUs\n`,
  );
  console.log("| measure | result |\n| --- | --- |");
  for (const r of rows) console.log(`| ${r.join(" | ")} |`);
});

/** Bytes held in each of the origin's caches (bodies read back, as the browser stores them). */
function cacheSizes(page: Page): Promise<Record<string, number>> {
  return page.evaluate(async () => {
    const out: Record<string, number> = {};
    for (const name of await caches.keys()) {
      const cache = await caches.open(name);
      let total = 0;
      for (const req of await cache.keys()) total += (await (await cache.match(req))!.arrayBuffer()).byteLength;
      out[name] = total;
    }
    return out;
  });
}
