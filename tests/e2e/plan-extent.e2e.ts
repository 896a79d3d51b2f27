/**
 * A digger draws a context's extent on the trench plan: picks the context, taps its corners, closes the ring
 * on the first corner and it is saved on the context; a self-crossing ring is refused with the reason and
 * nothing saved; clearing the extent and undoing the clear work through the server.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { openBrowser, shown } from "./support/browser";
import { openFreshPlan, tapPlan } from "./support/plan-trench";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

type Extent = { type: "Polygon"; coordinates: [number, number][][] } | null;

async function extentOf(page: Page, siteId: string, contextNumber: number): Promise<Extent> {
  const list = (await (await page.request.get(`/api/sites/${siteId}/contexts`)).json()) as {
    number: number;
    extent: Extent;
  }[];
  return list.find((c) => c.number === contextNumber)!.extent;
}

describe("trench plan, context extents", () => {
  it("draws, refuses a crossing ring, clears and undoes the clear", async () => {
    const { page, t } = await openFreshPlan(browser, "desktop");

    await page.getByRole("button", { name: /Draw extent/ }).click();
    await expect.poll(() => page.getByLabel("Context").inputValue()).not.toBe("");
    const corners: [number, number][] = [
      [2, 0.8],
      [5, 0.8],
      [4.6, 2.6],
      [3, 2.8],
    ];
    for (const [x, y] of corners) await tapPlan(page, false, x, y);
    await shown(page.getByText("Extent of context " + t.contextNumber + ": 4 corners"));
    await tapPlan(page, false, 2, 0.8); // the first corner again closes and saves
    await shown(page.getByText(`Extent of context ${t.contextNumber} saved.`));
    const saved = await extentOf(page, t.siteId, t.contextNumber);
    expect(saved?.coordinates[0]).toHaveLength(5); // closed ring
    const xs = saved!.coordinates[0].map((p) => p[0]);
    expect(Math.min(...xs)).toBeCloseTo(2, 1);
    expect(Math.max(...xs)).toBeCloseTo(5, 1);

    // a bow tie: refused on the page with the reason, the saved extent untouched
    for (const [x, y] of [
      [2, 0.8],
      [5, 2.6],
      [5, 0.8],
      [2, 2.6],
    ] as [number, number][])
      await tapPlan(page, false, x, y);
    await page.keyboard.press("Enter");
    await shown(page.getByRole("alert").filter({ hasText: /Not saved: .*cross/i }));
    expect(await extentOf(page, t.siteId, t.contextNumber)).toEqual(saved);

    await page.getByRole("button", { name: "Drop the corners" }).click();
    await page.getByRole("button", { name: "Clear the extent" }).click();
    await shown(page.getByText(`Extent of context ${t.contextNumber} cleared.`));
    expect(await extentOf(page, t.siteId, t.contextNumber)).toBeNull();

    await page.getByRole("button", { name: /^Undo: clear the extent/ }).click();
    await shown(page.getByText(/Undone: clear the extent/));
    expect(await extentOf(page, t.siteId, t.contextNumber)).toEqual(saved);
    await page.context().close();
  }, 90_000);
});
