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

describe("the level book in the browser", () => {
  /**
   * Readings invented for this test and reduced by hand (HI = RL + BS, RL = HI − sight):
   *   TBM WH1 (RL 50.000) BS 1.210 → HI 51.210
   *   ground  IS 1.860 → RL 49.350
   *   CP      FS 1.502 → RL 49.708, BS 1.377 → HI 51.085
   *   TBM WH2 FS 1.219 → RL 49.866 (known 49.874: −8 mm, outside ±5 mm); FS 1.209 → RL 49.876 (+2 mm, within)
   */
  it("a digger books a run: levels reduce as typed, the closing error is judged, the run is listed", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const [site] = await (await page.request.get("/api/sites")).json();
    const before = (await (await page.request.get(`/api/sites/${site.id}/level-runs`)).json()).length;
    await page.goto(`/sites/${site.id}/levels`);
    await shown(page.getByRole("heading", { name: "Level book" }));
    await shown(page.getByText(/metres above/));

    await page.getByLabel("Starts from benchmark").selectOption({ label: "TBM WH1 (50.000)" });
    await page.getByLabel("Closes on benchmark").selectOption({ label: "TBM WH2 (49.874)" });
    await page.getByLabel("Line 1 backsight").fill("1.210");
    await page.getByLabel("Line 2 staff on").selectOption("ground");
    await page.getByLabel("Line 2 intermediate sight").fill("1.860");
    const row = (n: number) => page.locator(`tr[data-line="${n}"]`);
    await shown(row(2).locator("[data-rl]").getByText("49.350"));
    expect(await row(1).locator("[data-hi]").textContent()).toBe("51.210");

    await page.getByRole("button", { name: "Add a line after line 2" }).click();
    await page.getByLabel("Line 3 staff on").selectOption("change_point");
    await page.getByLabel("Line 3 foresight").fill("1.502");
    await page.getByLabel("Line 3 backsight").fill("1.377");
    await shown(row(3).locator("[data-rl]").getByText("49.708"));
    expect(await row(3).locator("[data-hi]").textContent()).toBe("51.085");

    await page.getByLabel("Line 4 foresight").fill("1.219");
    await shown(row(4).locator("[data-rl]").getByText("49.866"));
    await shown(page.locator("[data-closure]").getByText(/Closing error −8 mm .* OUTSIDE tolerance/));
    await page.getByLabel("Line 4 foresight").fill("1.209");
    await shown(
      page.locator("[data-closure]").getByText(/Closing error \+2 mm against a tolerance of ±5 mm: within tolerance/),
    );
    expect(await page.locator("[data-rise]").textContent()).toBe("-0.124");

    // A reading that is not a number is named on its line, and nothing is sent.
    await page.getByLabel("Line 2 intermediate sight").fill("1.8x");
    await shown(row(2).getByText(/Line 2: the intermediate sight must be a staff reading/));
    await page.getByRole("button", { name: "Book the run" }).click();
    await shown(page.getByRole("alert").getByText("1 line of the book cannot be reduced yet."));
    expect((await (await page.request.get(`/api/sites/${site.id}/level-runs`)).json()).length).toBe(before);
    await page.getByLabel("Line 2 intermediate sight").fill("1.860");

    await page.getByRole("button", { name: "Book the run" }).click();
    await shown(page.getByText(/Run booked: 4 levels from TBM WH1, closing error 2 mm/));
    const runs = await (await page.request.get(`/api/sites/${site.id}/level-runs`)).json();
    expect(runs.length).toBe(before + 1);
    const mine = runs.find(
      (r: { misclosure: number; book: { station: string }[] }) =>
        r.book.length === 4 && Math.abs(r.misclosure - 0.002) < 1e-9 && r.book[1]!.station === "ground",
    );
    expect(mine).toBeDefined();
    expect(mine.withinTolerance).toBe(true);
    const listed = page.locator(`article[data-run="${mine.id}"]`);
    await shown(listed.getByText(/\+2 mm, within ±5 mm/));
    expect(await listed.locator("tbody tr").nth(2).locator("td").last().textContent()).toBe("49.708");
  });

  it("a finds specialist reads the level book but is not offered the booking form", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    const [site] = await (await page.request.get("/api/sites")).json();
    await page.goto(`/sites/${site.id}/levels`);
    await shown(page.getByRole("table", { name: "Benchmarks" }).getByText("TBM WH1"));
    expect(await page.getByRole("form", { name: "Book a levelling run" }).count()).toBe(0);
  });
});
