/**
 * What a digger is told about work still on the device: signing out with a find not yet sent asks first
 * (and the find stays in that user's outbox for the next sign-in), and a browser storage nearly full is
 * a warning in the device panel. The server is made unreachable for finds only, by aborting those requests
 * in the browser (service workers blocked, so the page's own requests are the ones routed).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { baseURL, openBrowser, shown, signIn } from "./support/browser";
import { freshTrench, tapPlan } from "./support/plan-trench";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const FINDS_POST = /\/api\/sites\/[^/]+\/finds$/;

async function diggerPage(init?: () => void): Promise<Page> {
  const context = await browser.newContext({
    baseURL: baseURL(),
    viewport: { width: 1366, height: 900 },
    serviceWorkers: "block",
  });
  if (init) await context.addInitScript(init);
  const page = await context.newPage();
  await signIn(page, "digger");
  return page;
}

describe("work still on the device", () => {
  it("signing out with an unsent find asks first; the find stays in the outbox for the next sign-in", async () => {
    const page = await diggerPage();
    const t = await freshTrench(page);
    // Finds cannot reach the server; everything else can (the device reserves its number blocks).
    await page.route(FINDS_POST, (route) =>
      route.request().method() === "POST" ? route.abort("internetdisconnected") : route.continue(),
    );
    const blocks = page.waitForResponse((r) => /number-blocks$/.test(r.url()) && r.request().method() === "POST");
    await page.goto(`/sites/${t.siteId}/trenches/${t.trenchId}`);
    await shown(page.getByTestId("plan-canvas"), 20_000);
    await blocks;

    await page.getByRole("button", { name: /Place find/ }).click();
    await tapPlan(page, false, 2, 1);
    await page.getByLabel("Class").selectOption({ index: 1 });
    await page.getByLabel("Context").selectOption({ label: `${t.contextNumber} · deposit` });
    await page.getByRole("button", { name: "Record find", exact: true }).click();
    await shown(page.getByTestId("plan-message").filter({ hasText: /Find #\d+ kept on this device/ }), 20_000);

    await page.getByRole("button", { name: "Sign out", exact: true }).click();
    const dialog = page.getByRole("alertdialog", { name: "Unsent work" });
    await shown(dialog);
    expect(await dialog.textContent()).toContain("1 record on this device has not reached the server.");
    // Staying keeps the user signed in, on the same page.
    await dialog.getByRole("button", { name: "Stay" }).click();
    expect(await dialog.count()).toBe(0);
    expect(page.url()).toContain(`/trenches/${t.trenchId}`);

    await page.getByRole("button", { name: "Sign out", exact: true }).click();
    await page
      .getByRole("alertdialog", { name: "Unsent work" })
      .getByRole("button", { name: "Sign out anyway" })
      .click();
    await page.waitForURL(/\/sign-in/);
    const api = await page.request.get(`/api/sites/${t.siteId}/finds?trenchId=${t.trenchId}`);
    expect(api.status()).toBe(401); // signed out: the session is gone

    // Signed in again on the same device, the find is still waiting in this user's outbox, and is sent
    // once the server can be reached.
    await signIn(page, "digger");
    await page.goto(`/sites/${t.siteId}/trenches/${t.trenchId}`);
    await shown(page.getByTestId("plan-canvas"), 20_000);
    await page.getByTestId("device-status").click();
    await shown(page.getByRole("heading", { name: "Waiting to be sent (1)" }));
    await page.unroute(FINDS_POST);
    await page.getByRole("button", { name: "Send now" }).click();
    await expect
      .poll(
        async () =>
          (
            (await (await page.request.get(`/api/sites/${t.siteId}/finds?trenchId=${t.trenchId}`)).json()) as {
              rows: unknown[];
            }
          ).rows.length,
        { timeout: 60_000, interval: 1_000 },
      )
      .toBe(1);
    await page.context().close();
  }, 150_000);

  it("a browser storage nearly full is a warning in the device panel", async () => {
    const page = await diggerPage(() => {
      // 95 of 100 MB used: above the warning share.
      Object.defineProperty(navigator.storage, "estimate", {
        value: async () => ({ usage: 95 * 1024 * 1024, quota: 100 * 1024 * 1024 }),
      });
    });
    const t = await freshTrench(page);
    await page.goto(`/sites/${t.siteId}/trenches/${t.trenchId}`);
    await shown(page.getByTestId("plan-canvas"), 20_000);
    await page.getByTestId("device-status").click();
    await shown(page.getByRole("alert").filter({ hasText: /Nearly full: send the outbox/ }));
    await page.context().close();
  }, 90_000);
});
