import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { shown } from "./support/browser";
import { openBrowser } from "./support/browser";
import { openFreshPlan, tapPlan } from "./support/plan-trench";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const numbersIn = (svg: string) =>
  [...svg.matchAll(/data-find="(\d+)"/g)].map((m) => Number(m[1])).sort((a, b) => a - b);

describe("a section of finds drawn on the plan", () => {
  it("a digger draws a line, sets the band, reads the projected finds, saves it and exports its SVG", async () => {
    const { page, t } = await openFreshPlan(browser, "desktop");
    const classes = await (await page.request.get(`/api/sites/${t.siteId}/classes`)).json();
    const contexts = await (await page.request.get(`/api/sites/${t.siteId}/contexts?trenchId=${t.trenchId}`)).json();
    const contextId = contexts.find((c: { number: number }) => c.number === t.contextNumber).id;
    // Around a line from (1, 1) to (7, 1) with a band of 0.5 m: 2 and 5 m along are in, 0.6 m off and 3 m north are
    // out.
    const at = [
      [2, 1.2, 49.5],
      [3, 0.4, 49.4],
      [5, 0.8, 49.3],
      [4, 4, 49.2],
    ] as const;
    const numbers: number[] = [];
    for (const [x, y, z] of at) {
      const res = await page.request.post(`/api/sites/${t.siteId}/finds`, {
        data: { contextId, classId: classes[0].id, x, y, z },
      });
      expect(res.status()).toBe(201);
      numbers.push((await res.json()).number);
    }
    await page.reload();
    await shown(page.getByTestId("plan-canvas"), 20_000);

    await page.getByRole("button", { name: /Section line/ }).click();
    await tapPlan(page, false, 1, 1);
    await shown(page.getByText("Now tap the end of the line (B)."));
    await tapPlan(page, false, 7, 1);
    await shown(page.getByTestId("section-overlay").getByText("B", { exact: true }));
    await page.getByLabel("Band either side (m)").fill("0.5");
    await page.getByLabel("Vertical exaggeration (×)").fill("5");
    await shown(page.getByTestId("section-drawn").getByText(`2 finds drawn: ${numbers[0]}, ${numbers[2]}`));
    const figure = page.getByTestId("section-figure").locator("svg");
    expect(numbersIn(await figure.evaluate((el) => el.outerHTML))).toEqual([numbers[0], numbers[2]]);
    expect(await figure.getAttribute("data-exaggeration")).toBe("5");
    await shown(page.getByTestId("section-figure").getByText(/Band ±0.50 m · vertical exaggeration ×5/));

    // Widen the band: the find 0.6 m off the line comes in.
    await page.getByLabel("Band either side (m)").fill("0.7");
    await shown(
      page.getByTestId("section-drawn").getByText(`3 finds drawn: ${numbers[0]}, ${numbers[1]}, ${numbers[2]}`),
    );

    await page.getByLabel("Name", { exact: true }).fill("S east");
    await page.getByRole("button", { name: "Save the section" }).click();
    await shown(page.getByText("Section S east saved."));
    await shown(page.locator('tr[data-section="S east"]'));
    const saved = await (await page.request.get(`/api/sites/${t.siteId}/trenches/${t.trenchId}/sections`)).json();
    expect(saved).toHaveLength(1);
    expect(saved[0].halfWidth).toBe(0.7);
    expect(saved[0].exaggeration).toBe(5);
    const svg = await (
      await page.request.get(`/api/sites/${t.siteId}/trenches/${t.trenchId}/sections/${saved[0].id}/export?format=svg`)
    ).text();
    expect(numbersIn(svg)).toEqual([numbers[0], numbers[1], numbers[2]]);

    // The printed trench record carries the section.
    await page.goto(`/sites/${t.siteId}/reports/${t.trenchId}`);
    const printed = page.getByRole("figure", { name: "Section S east" });
    await shown(printed);
    expect(numbersIn(await printed.locator("svg").evaluate((el) => el.outerHTML))).toEqual([
      numbers[0],
      numbers[1],
      numbers[2],
    ]);
  });
});
