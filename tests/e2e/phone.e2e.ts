/**
 * Loamwork on a phone (390 × 844, touch): the plan is the largest thing on screen, its tools in one menu,
 * the find form opens as a sheet over the plan, nothing scrolls sideways, and what a thumb presses is at
 * least 44 px (the common practice for touch targets).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { baseURL, openBrowser, shown, signIn } from "./support/browser";
import { freshTrench, tapPlan } from "./support/plan-trench";

const PHONE = { width: 390, height: 844 };
let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function phonePage(role: "digger" | "specialist") {
  const context = await browser.newContext({ baseURL: baseURL(), viewport: PHONE, hasTouch: true, isMobile: true });
  const page = await context.newPage();
  await signIn(page, role);
  return page;
}

const sideways = (page: Page) =>
  page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);

/** Visible buttons, links-as-buttons and fields inside `selector` smaller than 44 px either way. */
function smallTargets(page: Page, selector: string) {
  return page.evaluate((sel) => {
    const out: string[] = [];
    for (const el of document.querySelectorAll<HTMLElement>(
      `${sel} button, ${sel} select, ${sel} input, ${sel} [role=tab]`,
    )) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.height === 0 || getComputedStyle(el).visibility === "hidden") continue;
      if (r.height < 44 || r.width < 44)
        out.push(
          `${el.tagName} "${(el.textContent ?? el.getAttribute("aria-label") ?? "").trim().slice(0, 30)}" ${Math.round(r.width)}×${Math.round(r.height)}`,
        );
    }
    return out;
  }, selector);
}

describe("Loamwork on a phone", () => {
  it("the plan takes most of the screen, its tools fold into one menu and the find form opens as a sheet", async () => {
    const page = await phonePage("digger");
    const t = await freshTrench(page);
    await page.goto(`/sites/${t.siteId}/trenches/${t.trenchId}`);
    await shown(page.getByTestId("plan-canvas"), 20_000);
    expect(await sideways(page)).toBeLessThanOrEqual(0);

    const toolbar = (await page.getByRole("toolbar", { name: "Plan tools" }).boundingBox())!;
    expect(toolbar.height).toBeLessThanOrEqual(60);
    const canvas = (await page.getByTestId("plan-canvas").boundingBox())!;
    // The canvas is the largest thing on the screen (measured 387 of 844 px below the header and the site's nav).
    expect(canvas.height).toBeGreaterThanOrEqual(0.45 * PHONE.height);
    expect(await smallTargets(page, "[role=toolbar]")).toEqual([]);
    expect(await smallTargets(page, "header")).toEqual([]);

    await page.getByLabel("Plan tool", { exact: true }).selectOption("place");
    await tapPlan(page, true, 3, 1);
    const form = page.getByRole("form", { name: "New find" });
    await shown(form);
    const sheet = (await page.getByRole("complementary", { name: "Plan panels" }).boundingBox())!;
    // Over the plan and inside the screen (the form scrolls within the sheet).
    expect(sheet.y + sheet.height).toBeLessThanOrEqual(PHONE.height + 1);
    expect(sheet.y).toBeLessThan(canvas.y + canvas.height);
    expect(await smallTargets(page, "form[aria-label='New find']")).toEqual([]);
    expect(await sideways(page)).toBeLessThanOrEqual(0);
    await page.context().close();
  });

  it("the Patterns page does not scroll sideways", async () => {
    const page = await phonePage("specialist");
    const sites = (await (await page.request.get("/api/sites")).json()) as { id: string; code: string }[];
    const site = sites.find((s) => s.code === "WHD26")!;
    // A saved run, so the page holds its widest part (the saved runs table) whatever ran before.
    const list = async <T>(what: string) =>
      (await (await page.request.get(`/api/sites/${site.id}/${what}`)).json()) as T[];
    const trench = (await list<{ id: string; code: string }>("trenches")).find((t) => t.code === "A")!;
    const context = (await list<{ id: string; number: number }>("contexts")).find((c) => c.number === 1005)!;
    const classes = (await list<{ id: string; code: string }>("classes")).filter((c) =>
      ["FLK", "SHD"].includes(c.code),
    );
    const run = await page.request.post(`/api/sites/${site.id}/runs`, {
      data: {
        scope: { trenchId: trench.id, contextIds: [context.id], classIds: classes.map((c) => c.id) },
        tests: [{ kind: "quadrat", cellSize: 2 }],
        params: { nsim: 19, seed: 5 },
      },
    });
    expect(run.ok()).toBe(true);
    await page.goto(`/sites/${site.id}/patterns`);
    await shown(page.getByRole("heading", { level: 1 }));
    await shown(page.getByRole("table", { name: "Saved runs" }));
    await page.waitForLoadState("networkidle");
    expect(await sideways(page)).toBeLessThanOrEqual(0);
    await page.context().close();
  });
});
