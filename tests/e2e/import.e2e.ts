import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { newPage, openBrowser, shown, signIn } from "./support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("total-station import in the browser", () => {
  it("says which columns it reads before a file is chosen, keeps point IDs apart from find numbers and allocates the numbers", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const [site] = await (await page.request.get("/api/sites")).json();
    const trenches = await (await page.request.get(`/api/sites/${site.id}/trenches`)).json();
    const a = trenches.find((t: { code: string }) => t.code === "A");
    const contexts = await (await page.request.get(`/api/sites/${site.id}/contexts`)).json();
    const open = contexts.find((c: { trenchId: string; state: string }) => c.trenchId === a.id && c.state === "open");
    expect(open).toBeTruthy();

    await page.goto(`/sites/${site.id}/finds/import`);
    const hints = page.getByRole("group", { name: "Columns the import reads" });
    await shown(hints.getByText("Station point ID"));
    await shown(hints.getByText("never used as its number"));
    await shown(hints.getByText("x (easting, m) *"));

    // Point IDs 1 and 2 are also find numbers already on the site: before, every row clashed with them.
    const csv = ["Pt,E,N,Code,Ctx", `1,2.10,1.20,FLK,${open.number}`, `2,2.40,1.35,FLK,${open.number}`].join("\n");
    await page
      .locator("#ts-file")
      .setInputFiles({ name: "station-day.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    await shown(page.getByRole("form", { name: "Map the columns" }));
    expect(await page.locator("#map-stationPoint").inputValue()).toBe("Pt");
    expect(await page.locator("#map-number").inputValue()).toBe("");
    await page.getByRole("button", { name: "Import all 2 rows" }).click();
    const done = page.getByRole("status").filter({ hasText: /Imported 2 finds/ });
    await shown(done);
    const [first, last] = ((await done.textContent())!.match(/numbers (\d+)–(\d+)/) ?? []).slice(1).map(Number);
    expect(last - first).toBe(1);
    expect(first).toBeGreaterThan(2);
    const list = await (await page.request.get(`/api/sites/${site.id}/finds?sort=number&dir=desc&pageSize=5`)).json();
    const mine = list.rows.filter((r: { number: number }) => r.number >= first && r.number <= last);
    expect(mine.map((r: { number: number; stationPoint: string }) => [r.number, r.stationPoint]).sort()).toEqual([
      [first, "1"],
      [last, "2"],
    ]);
    await page.context().close();
  });
});
