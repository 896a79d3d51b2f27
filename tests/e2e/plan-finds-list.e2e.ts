import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { newPage, openBrowser, shown, signIn } from "./support/browser";
import { at } from "./support/plan-trench";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

type Row = { id: string; number: number; x: number; y: number; classCode: string; contextNumber: number };

describe("the plan's finds list", () => {
  it("lists every find of a busy trench, drawing only those in sight, searchable, and in step with the plan's selection", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const [site] = await (await page.request.get("/api/sites")).json();
    const trenches = await (await page.request.get(`/api/sites/${site.id}/trenches`)).json();
    const a = trenches.find((t: { code: string }) => t.code === "A");
    const all: Row[] = (
      await (await page.request.get(`/api/sites/${site.id}/finds?trenchId=${a.id}&pageSize=500`)).json()
    ).rows;
    expect(all.length).toBeGreaterThan(300); // the demo's trench A: more than the 300 the old list stopped at

    await page.goto(`/sites/${site.id}/trenches/${a.id}`);
    await shown(page.getByTestId("plan-canvas"), 20_000);
    const list = page.getByRole("list", { name: "Finds on the plan" });
    await shown(page.getByText(`${all.length} finds shown.`));
    const drawn = await list.getByRole("listitem").count();
    expect(drawn).toBeGreaterThan(5);
    expect(drawn).toBeLessThan(80);

    // The oldest find is reachable by scrolling to the end of the list.
    const oldest = all.reduce((m, f) => (f.number < m.number ? f : m));
    await page.getByTestId("finds-list-scroller").evaluate((el) => el.scrollTo(0, el.scrollHeight));
    await shown(list.locator(`[data-find-number="${oldest.number}"]`));

    // Search by number, by class and by context.
    const search = page.getByLabel("Search finds");
    await search.fill(`#${oldest.number}`);
    await shown(list.locator(`[data-find-number="${oldest.number}"]`));
    const cls = all[0].classCode;
    const ofClass = all.filter((f) => f.classCode === cls).length;
    await search.fill(cls);
    await shown(page.getByText(`${ofClass} ${ofClass === 1 ? "find" : "finds"} of ${all.length} match.`));
    const ctx = all[0].contextNumber;
    const inCtx = all.filter((f) => f.contextNumber === ctx).length;
    await search.fill(`ctx ${ctx}`);
    await shown(page.getByText(`${inCtx} ${inCtx === 1 ? "find" : "finds"} of ${all.length} match.`));
    await search.fill("");

    // A find tapped on the plan is selected in the list and scrolled into sight, wherever it lies in it.
    const target = oldest;
    const [sx, sy] = await at(page, target.x, target.y);
    const box = (await page.getByTestId("plan-canvas").boundingBox())!;
    const view = JSON.parse((await page.getByTestId("plan-canvas").getAttribute("data-view"))!) as {
      scale: number;
      ox: number;
      oy: number;
    };
    const nearest = all.reduce(
      (m, f) => {
        const d = Math.hypot(box.x + view.ox + f.x * view.scale - sx, box.y + view.oy - f.y * view.scale - sy);
        return d < m.d ? { f, d } : m;
      },
      { f: target, d: Infinity },
    ).f;
    await page.getByTestId("finds-list-scroller").evaluate((el) => el.scrollTo(0, 0));
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.mouse.click(sx, sy);
    const picked = list.locator(`[data-find-number="${nearest.number}"]`);
    await shown(picked);
    expect(await picked.getAttribute("aria-pressed")).toBe("true");
    expect(await picked.isVisible()).toBe(true);
    await page.context().close();
  });
});
