/**
 * Recording in a trench with no signal, then syncing exactly once, in Debian's Chromium: the network switched off
 * through the DevTools
 * protocol AND the app server stopped (emulated offline alone does not cover the service worker's own
 * requests). The test runs its own app (tests/e2e/support/own-stack.ts) so it can stop and start it.
 */
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import type { Stack } from "@/scripts/stack";
import { openBrowser, shown, signIn } from "./support/browser";
import { freshTrench, tapPlan } from "./support/plan-trench";
import { ownStack } from "./support/own-stack";
import { keptOnDevice, networkOff, trenchContextId } from "./support/offline-device";

let browser: Browser;
let stack: Stack;
beforeAll(async () => {
  [browser, stack] = await Promise.all([openBrowser(), ownStack("offline-sync")]);
});
afterAll(async () => {
  await browser?.close();
  await stack?.stop();
});

/** The app server stopped (the site's network out of reach) until `serverBack`; a failed test brings it back. */
let serverDown = false;
async function serverGone() {
  await stack.stopApp();
  serverDown = true;
}
async function serverBack() {
  await stack.startApp();
  serverDown = false;
}
/** With E2E_VERBOSE=1, each step and its time since the file started. */
const started = Date.now();
const step = (what: string) => {
  if (process.env.E2E_VERBOSE) console.log(`[offline-sync ${((Date.now() - started) / 1000).toFixed(1)} s] ${what}`);
};
afterEach(async () => {
  if (serverDown) await serverBack();
});

/**
 * Opens a page once the service worker is active: a page whose loading began while the worker was still
 * being installed is not taken over by it (the browser's rule), so it would never be kept on the device.
 */
async function openWithWorker(page: Page, url: string) {
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => true));
  await page.goto(url);
}

/** The device's status in the header (data attributes say the state and the counts). */
async function deviceState(page: Page) {
  const el = page.getByTestId("device-status");
  return {
    state: await el.getAttribute("data-state"),
    waiting: Number(await el.getAttribute("data-waiting")),
    attention: Number(await el.getAttribute("data-attention")),
  };
}

async function waitForDevice(
  page: Page,
  fn: (s: Awaited<ReturnType<typeof deviceState>>) => boolean,
  what: string,
  timeout = 60_000,
) {
  const until = Date.now() + timeout;
  let last = await deviceState(page);
  while (Date.now() < until) {
    const now = await deviceState(page);
    if (process.env.E2E_VERBOSE && JSON.stringify(now) !== JSON.stringify(last)) step(`device ${JSON.stringify(now)}`);
    last = now;
    if (fn(last)) return last;
    await page.waitForTimeout(250);
  }
  throw new Error(`the device never showed ${what}; last seen ${JSON.stringify(last)}`);
}

/** Every entry of the user's outbox, read straight from IndexedDB. */
function readOutbox(page: Page): Promise<unknown[]> {
  return page.evaluate(async () => {
    const names = (await indexedDB.databases()).map((d) => d.name!).filter((n) => n.startsWith("loamwork-outbox-"));
    const db = await new Promise<IDBDatabase>((resolve, reject) => {
      const r = indexedDB.open(names[0]);
      r.onsuccess = () => resolve(r.result);
      r.onerror = () => reject(r.error);
    });
    return new Promise<unknown[]>((resolve) => {
      const r = db.transaction("entries").objectStore("entries").getAll();
      r.onsuccess = () => resolve(r.result);
    });
  });
}

/** Puts entries back into the outbox as they were (a replay of the same outbox). */
function putBack(page: Page, entries: unknown[]): Promise<void> {
  return page.evaluate(async (list) => {
    const names = (await indexedDB.databases()).map((d) => d.name!).filter((n) => n.startsWith("loamwork-outbox-"));
    const db = await new Promise<IDBDatabase>((resolve) => {
      const r = indexedDB.open(names[0]);
      r.onsuccess = () => resolve(r.result);
    });
    await new Promise<void>((resolve) => {
      const tx = db.transaction("entries", "readwrite");
      for (const e of list) tx.objectStore("entries").put(e);
      tx.oncomplete = () => resolve();
    });
  }, entries);
}

type Block = { id: string; kind: string; first: number; last: number; deviceId: string };

describe("recording offline and syncing exactly once", () => {
  it("20 finds and a context sheet with a relation, recorded with the server gone, land once, numbered from the device's blocks", async () => {
    const context = await browser.newContext({ baseURL: stack.url, viewport: { width: 1366, height: 900 } });
    let page = await context.newPage();
    await signIn(page, "digger");
    const t = await freshTrench(page);
    const planUrl = `/sites/${t.siteId}/trenches/${t.trenchId}`;
    step("open the plan online");
    await openWithWorker(page, planUrl);
    await shown(page.getByTestId("plan-canvas"), 20_000);
    await keptOnDevice(page, planUrl, stack.url);
    // Online once: the device reserves a block of find numbers and one of context numbers.
    await waitForNumbers(page);
    step("numbers reserved");
    const device = await page.evaluate(() => localStorage.getItem("loamwork-device-id"));
    const blocks = ((await (await page.request.get(`/api/sites/${t.siteId}/number-blocks`)).json()) as Block[]).filter(
      (b) => b.deviceId === device,
    );
    const findBlock = blocks.find((b) => b.kind === "find")!;
    const contextBlock = blocks.find((b) => b.kind === "context")!;
    expect(findBlock.last - findBlock.first + 1).toBe(50);
    const before = await counts(page, t);

    step("server stopped");
    await serverGone();
    await networkOff(context, page, true);
    step("reload offline");
    await page.reload();
    await shown(page.getByTestId("plan-canvas"), 20_000);

    // 20 finds placed by tap, each numbered at once from the block.
    const shownNumbers: number[] = [];
    for (let i = 0; i < 20; i++) {
      step(`find ${i + 1}`);
      await page.getByRole("button", { name: /Place find/ }).click();
      await tapPlan(page, false, 2 + (i % 5) * 0.9, 0.5 + Math.floor(i / 5) * 0.5);
      if (i === 0) {
        await page.getByLabel("Class").selectOption({ index: 1 });
        await page.getByLabel("Context").selectOption({ label: `${t.contextNumber} · deposit` });
      }
      await page.getByRole("button", { name: "Record find", exact: true }).click();
      shownNumbers.push(Number(/#(\d+)/.exec(await keptMessage(page))![1]));
    }
    expect(shownNumbers).toEqual(Array.from({ length: 20 }, (_, i) => findBlock.first + i));

    // One context sheet, numbered from the context block, with a relation checked on the device.
    step("context sheet");
    await page.getByTestId("device-status").click();
    const sheet = page.getByRole("form", { name: "Open a context sheet" });
    await sheet.getByLabel("Trench").selectOption({ label: t.code });
    await sheet.getByLabel("Other context").selectOption({ label: String(t.contextNumber) });
    await sheet.getByRole("button", { name: "Open context sheet" }).click();
    await shown(sheet.getByText(`Context ${contextBlock.first} above ${t.contextNumber} kept on this device`));
    await waitForDevice(page, (s) => s.waiting === 22, "22 waiting");
    step("outbox read");

    // The tab is closed and opened again, still offline: the outbox is still there, and so are the finds.
    const saved = await readOutbox(page);
    expect(saved).toHaveLength(22);
    await page.close();
    page = await context.newPage();
    await networkOff(context, page, true);
    step("reopened offline");
    await page.goto(planUrl);
    await shown(page.getByTestId("plan-canvas"), 20_000);
    await waitForDevice(page, (s) => s.waiting === 22 && s.state === "offline", "22 waiting, offline");
    await shown(page.getByText(`#${findBlock.first + 19}`));

    // The server is back and the network on: the outbox goes, in order, exactly once.
    step("server back");
    await serverBack();
    await networkOff(context, page, false);
    await page.evaluate(() => window.dispatchEvent(new Event("online")));
    await waitForDevice(page, (s) => s.waiting === 0 && s.attention === 0 && s.state === "online", "everything sent");
    step("synced");
    const after = await counts(page, t);
    expect(after.finds - before.finds).toBe(20);
    expect(after.contexts - before.contexts).toBe(1);
    expect(after.relations - before.relations).toBe(1);
    expect(after.findNumbers.filter((n) => !before.findNumbers.includes(n)).sort((a, b) => a - b)).toEqual(
      shownNumbers,
    );
    expect(after.contextNumbers).toContain(contextBlock.first);

    // A second replay of the same outbox (same keys, same bodies) writes nothing.
    step("replay");
    await putBack(page, saved);
    expect(await readOutbox(page)).toHaveLength(22);
    await page.evaluate(() => window.dispatchEvent(new Event("online")));
    await expect.poll(async () => (await readOutbox(page)).length, { timeout: 60_000 }).toBe(0);
    await waitForDevice(page, (s) => s.waiting === 0 && s.attention === 0, "the replay sent");
    expect(await counts(page, t)).toEqual(after);
    await context.close();
  }, 120_000);

  it("finds queued for a context signed off meanwhile wait in needs attention with the reason, and none is lost", async () => {
    const context = await browser.newContext({ baseURL: stack.url, viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    await signIn(page, "digger");
    const t = await freshTrench(page);
    const base = `/api/sites/${t.siteId}`;
    const target = await trenchContextId(page, t);
    const other = await page.request.post(`${base}/contexts`, {
      data: { trenchId: t.trenchId, number: t.contextNumber + 1, type: "deposit" },
    });
    const otherId = (await other.json()).id as string;
    const planUrl = `/sites/${t.siteId}/trenches/${t.trenchId}`;
    step("test 2: plan online");
    await openWithWorker(page, planUrl);
    await shown(page.getByTestId("plan-canvas"), 20_000);
    await keptOnDevice(page, planUrl, stack.url);
    await waitForNumbers(page);

    await networkOff(context, page, true);
    await page.evaluate(() => window.dispatchEvent(new Event("offline")));
    for (let i = 0; i < 3; i++) {
      step("test 2: offline");
      await page.getByRole("button", { name: /Place find/ }).click();
      await tapPlan(page, false, 3 + i * 0.5, 1);
      if (i === 0) {
        await page.getByLabel("Class").selectOption({ index: 1 });
        await page.getByLabel("Context").selectOption({ label: `${t.contextNumber} · deposit` });
      }
      await page.getByRole("button", { name: "Record find", exact: true }).click();
      await keptMessage(page);
    }
    await waitForDevice(page, (s) => s.waiting === 3, "3 waiting");
    step("test 2: director signs off");

    // Meanwhile the sheet is completed, submitted and signed off by the director (another device).
    const director = await browser.newContext({ baseURL: stack.url });
    const dPage = await director.newPage();
    await signIn(dPage, "director");
    const sheet = {
      colour: "brown",
      compaction: "firm",
      composition: "silty clay",
      description: "a deposit",
      interpretation: "a floor",
    };
    expect((await dPage.request.patch(`${base}/contexts/${target}`, { data: sheet })).status()).toBe(200);
    expect(
      (
        await dPage.request.post(`${base}/relations`, { data: { contextId: target, reading: "above", otherId } })
      ).status(),
    ).toBe(201);
    expect((await dPage.request.post(`${base}/sign-off/${target}/submit`)).status()).toBe(200);
    expect((await dPage.request.post(`${base}/sign-off/${target}/lock`)).status()).toBe(200);
    await director.close();
    step("test 2: online again");

    await networkOff(context, page, false);
    await page.evaluate(() => window.dispatchEvent(new Event("online")));
    await waitForDevice(page, (s) => s.waiting === 0 && s.attention === 3, "3 needing attention");
    await page.getByTestId("device-status").click();
    const entries = page.getByTestId("attention-entry");
    expect(await entries.count()).toBe(3);
    for (const code of await entries.evaluateAll((els) => els.map((e) => e.getAttribute("data-code"))))
      expect(code).toBe("locked");
    await shown(entries.first().getByText(/signed off/i));

    step("test 2: resolve");
    // Resolved: each moves to the open context and lands; none is lost.
    for (let i = 0; i < 3; i++) {
      const first = page.getByTestId("attention-entry").first();
      await first.getByRole("button", { name: "Move to an open context" }).click();
      await first.getByLabel("Move to context").selectOption({ label: String(t.contextNumber + 1) });
      await waitForDevice(page, (s) => s.attention === 2 - i, `${2 - i} needing attention`);
    }
    await waitForDevice(page, (s) => s.waiting === 0 && s.attention === 0, "everything sent");
    const rows = (await (await page.request.get(`${base}/finds?trenchId=${t.trenchId}`)).json()) as {
      rows: { contextId: string }[];
    };
    expect(rows.rows.filter((r) => r.contextId === otherId)).toHaveLength(3);
    await context.close();
  }, 120_000);
});

/** The plan's word on the find just recorded, which must say it was kept on the device; then dismissed. */
async function keptMessage(page: Page): Promise<string> {
  const said = page.getByTestId("plan-message").or(page.getByRole("alert").filter({ hasText: /\S/ }));
  await shown(said);
  const text = (await said.first().textContent()) ?? "";
  if (!/kept on this device/.test(text))
    throw new Error(`the plan said "${text}", not that the find was kept on the device`);
  await page.getByRole("button", { name: "Dismiss message" }).click();
  return text;
}

/** Online once, the device reserves a block of find numbers and one of context numbers (50 each by default). */
async function waitForNumbers(page: Page) {
  await page.getByTestId("device-status").click();
  const left = page.getByTestId("numbers-left").locator("dd");
  await expect.poll(() => left.allTextContents(), { timeout: 30_000 }).toEqual(["50 left", "50 left"]);
  await page.getByRole("button", { name: "Close" }).click();
}

/** What the server holds for the trench: finds and their numbers, the site's contexts and relations. */
async function counts(page: Page, t: { siteId: string; trenchId: string }) {
  const base = `/api/sites/${t.siteId}`;
  const finds = (await (await page.request.get(`${base}/finds?trenchId=${t.trenchId}&pageSize=500`)).json()) as {
    total: number;
    rows: { number: number }[];
  };
  const contexts = (await (await page.request.get(`${base}/contexts`)).json()) as { number: number }[];
  const relations = (await (await page.request.get(`${base}/relations`)).json()) as unknown[];
  return {
    finds: finds.total,
    findNumbers: finds.rows.map((r) => r.number),
    contexts: contexts.length,
    contextNumbers: contexts.map((c) => c.number),
    relations: relations.length,
  };
}
