/**
 * Counts by square on a tablet: a director sets a fresh trench's 1 m grid, taps a square on the squares map,
 * enters a count in its compact form and sees the square shaded, a 0 drawn apart from the unexcavated
 * squares, and the legend say which classing it uses.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { newPage, openBrowser, shown, signIn } from "./support/browser";
import { freshTrench } from "./support/plan-trench";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("counts by grid square", () => {
  it("enters a count by tapping a square and sees it on the map", async () => {
    const page = await newPage(browser, "tablet");
    await signIn(page, "director");
    const t = await freshTrench(page);
    await page.goto(`/sites/${t.siteId}/trenches/${t.trenchId}`);
    const panel = page.getByTestId("squares-panel");
    await shown(panel.getByText("This trench has no square grid yet."), 20_000);
    await panel.getByLabel("Square size (m)").fill("1");
    await panel.getByRole("button", { name: "Set the grid" }).click();
    const square = panel.locator('[data-square="2/1"]');
    await shown(square, 20_000);
    // The fresh trench is a triangle (0,0)–(8,0)–(4,6): nothing is dug yet.
    expect(await square.getAttribute("data-kind")).toBe("not-excavated");
    await panel.getByRole("combobox", { name: /^Class(?!es)/ }).selectOption({ label: "FLK — Flint flake" });

    await square.tap();
    const form = page.getByRole("form", { name: "Counts in square 2/1" });
    await shown(form);
    await form.getByLabel("Count of FLK").fill("7");
    await form.getByRole("button", { name: "Save the square" }).click();
    await shown(panel.getByText("Square 2/1 saved."));
    await expect.poll(() => square.getAttribute("data-kind"), { timeout: 15_000 }).toBe("value");

    await panel.locator('[data-square="3/1"]').tap();
    const zeroForm = page.getByRole("form", { name: "Counts in square 3/1" });
    await zeroForm.getByLabel("Count of FLK").fill("0");
    await zeroForm.getByRole("button", { name: "Save the square" }).click();
    await expect
      .poll(() => panel.locator('[data-square="3/1"]').getAttribute("data-kind"), { timeout: 15_000 })
      .toBe("zero");
    expect(await panel.locator('[data-square="4/1"]').getAttribute("data-kind")).toBe("not-excavated");

    const legend = panel.getByTestId(`sq-${t.code}-svg`);
    await expect.poll(() => legend.textContent()).toContain("quantile classes");
    expect(await legend.textContent()).toContain("not excavated (left out of tests)");
    expect(await legend.textContent()).toContain("0 (counted, none found)");
    await panel.getByRole("combobox", { name: /^Classes/ }).selectOption("equal");
    await expect.poll(() => legend.textContent()).toContain("equal-interval classes");

    const stored = (await (await page.request.get(`/api/sites/${t.siteId}/trenches/${t.trenchId}/squares`)).json()) as {
      samples: { label: string; counts: { count: number }[] }[];
    };
    expect(stored.samples.map((s) => [s.label, s.counts[0]!.count]).sort()).toEqual([
      ["2/1", 7],
      ["3/1", 0],
    ]);
    await page.context().close();
  });
});
