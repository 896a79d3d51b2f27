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
import path from "node:path";
import { rmSync } from "node:fs";
import os from "node:os";
import type { Page } from "playwright-core";
import { launchChromium } from "./chromium";
import { ApiError, buildRequest, type ApiRequest } from "../lib/api/client";
import { Outbox } from "../lib/offline/outbox";
import { syncOutbox } from "../lib/offline/sync";
import { createWritePath } from "../lib/offline/write-path";
import { ensureBuilt, startStack } from "./stack";
import { signInDemo } from "./sign-in-demo";

const N = Number(process.env.BENCH_FINDS ?? 5000);
const QUEUED = Number(process.env.BENCH_QUEUED ?? 500);
const RUNS = Number(process.env.BENCH_RUNS ?? 3);
const port = Number(process.env.BENCH_PORT ?? 3392);

function points(n: number) {
  let s = 20261203;
  const rnd = () => (s = (s * 48271) % 2147483647) / 2147483647;
  return Array.from(
    { length: n },
    () => [Number((1 + rnd() * 38).toFixed(3)), Number((1 + rnd() * 28).toFixed(3))] as const,
  );
}
const median = (a: number[]) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)];

ensureBuilt();
const dataDir = path.join(".tmp", "bench-offline");
rmSync(dataDir, { recursive: true, force: true });
const stack = await startStack({ port, dataDir, quiet: true });
const browser = await launchChromium();
const rows: string[][] = [];
try {
  const context = await browser.newContext({ baseURL: stack.url, viewport: { width: 1366, height: 900 } });
  await context.addInitScript({ content: "window.__name = (f) => f;" });
  const page = await context.newPage();
  await signInDemo(page, "director");
  const [site] = (await (await page.request.get("/api/sites")).json()) as { id: string }[];
  const outline = {
    type: "Polygon",
    coordinates: [
      [
        [0, 0],
        [40, 0],
        [40, 30],
        [0, 30],
        [0, 0],
      ],
    ],
  };
  const trench = await (
    await page.request.post(`/api/sites/${site.id}/trenches`, {
      data: { code: "OFFB", name: "Offline benchmark", outline },
    })
  ).json();
  const ctx = await (
    await page.request.post(`/api/sites/${site.id}/contexts`, {
      data: { trenchId: trench.id, number: 9101, type: "deposit" },
    })
  ).json();
  const classes = (await (await page.request.get(`/api/sites/${site.id}/classes`)).json()) as {
    id: string;
    code: string;
  }[];
  const csv = [
    "x,y,class,context",
    ...points(N).map(([x, y], i) => `${x},${y},${classes[i % classes.length].code},9101`),
  ].join("\n");
  const imported = await page.request.post(`/api/sites/${site.id}/import`, {
    data: { csv, fileName: "bench.csv", mapping: { x: "x", y: "y", classCode: "class", contextNumber: "context" } },
    timeout: 300_000,
  });
  if (imported.status() !== 201) throw new Error(`import failed: ${imported.status()} ${await imported.text()}`);

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
  await send(buildRequest("siteUpdate", { siteId: site.id }, { numberBlockSize: QUEUED } as never));
  const block = (await send({
    operation: "numberBlocksCreate" as never,
    method: "POST",
    url: `/api/sites/${site.id}/number-blocks`,
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ kind: "find", deviceId: crypto.randomUUID() }),
  })) as { id: string; first: number; last: number };
  const outbox = await Outbox.open("bench");
  await outbox.putBlock({
    id: block.id,
    siteId: site.id,
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
        { siteId: site.id },
        { contextId: ctx.id, classId: classes[i % classes.length].id, x, y, method: "plan" },
      ),
    );
  const t0 = performance.now();
  const out = await syncOutbox({ outbox, send });
  const syncMs = performance.now() - t0;
  if (out.sent !== QUEUED) throw new Error(`sync sent ${out.sent} of ${QUEUED}: ${JSON.stringify(out)}`);

  // 2. Offline reload of the plan with N + QUEUED finds, and 3. what the service worker keeps.
  const planUrl = `/sites/${site.id}/trenches/${trench.id}`;
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
} finally {
  await browser.close();
  await stack.stop();
}

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
