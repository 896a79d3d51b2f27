/**
 * Loamwork in a trench with no signal, in Debian's Chromium: the network switched off through the DevTools
 * protocol AND the app server stopped (emulated offline alone does not cover the service worker's own
 * requests). The test runs its own app (tests/e2e/support/own-stack.ts) so it can stop and start it.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import type { Stack } from "@/scripts/stack";
import { openBrowser, shown, signIn } from "./support/browser";
import { freshTrench } from "./support/plan-trench";
import { ownStack } from "./support/own-stack";
import { keptOnDevice, networkOff, trenchContextId } from "./support/offline-device";

let browser: Browser;
let stack: Stack;
beforeAll(async () => {
  [browser, stack] = await Promise.all([openBrowser(), ownStack("offline")]);
});
afterAll(async () => {
  await browser?.close();
  await stack?.stop();
});

describe("the app on a device with no connection", () => {
  it("opens a trench plan seen once online, with its finds, after the server has gone", async () => {
    const context = await browser.newContext({ baseURL: stack.url, viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    await signIn(page, "digger");
    const t = await freshTrench(page);
    const made = await page.request.post(`/api/sites/${t.siteId}/finds`, {
      data: {
        contextId: await trenchContextId(page, t),
        classId: await firstClass(page, t.siteId),
        x: 2,
        y: 1,
        method: "plan",
      },
    });
    expect(made.status()).toBe(201);
    const planUrl = `/sites/${t.siteId}/trenches/${t.trenchId}`;
    await page.goto(planUrl);
    await shown(page.getByTestId("plan-canvas"), 20_000);
    await keptOnDevice(page, planUrl, stack.url);

    await stack.stopApp();
    await networkOff(context, page, true);
    await page.reload();
    await shown(page.getByTestId("plan-canvas"), 20_000);
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toContain(`Trench ${t.code}`);
    await shown(page.getByText(`#${(await made.json()).number}`));

    // A page never opened on this device says so, instead of the browser's own error.
    await page.goto(`/sites/${t.siteId}/audit`);
    await shown(page.getByRole("heading", { name: "Not on this device yet" }));
    await context.close();
    await stack.startApp();
  });
});

async function firstClass(page: Page, siteId: string) {
  return ((await (await page.request.get(`/api/sites/${siteId}/classes`)).json()) as { id: string }[])[0].id;
}
