/**
 * A finds specialist in the Patterns workspace: picks a scope, runs, watches progress, reads the verdict
 * and sees the plot; the run survives a reload; a run can be cancelled; a digger reads but cannot run.
 * Fewer simulations than the default (99) keep the test short; FLK's clustering and SHD's randomness in
 * the demo (scripts/seed/seed-demo.ts) are decided at that number too (see tests/integration/patterns-verdicts).
 */
import { readFile } from "node:fs/promises";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { newPage, openBrowser, shown, signIn } from "./support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function openPatterns(page: Page) {
  await page.getByRole("listitem").filter({ hasText: "Whinnydale Holm" }).getByRole("link").first().click();
  await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/);
  await page.getByRole("navigation", { name: "Site sections" }).getByRole("link", { name: "Patterns" }).click();
  await shown(page.getByRole("heading", { level: 1, name: "Patterns" }));
}

async function chooseScope(page: Page, classes: string[]) {
  await page.getByRole("checkbox", { name: /^1005/ }).check();
  for (const c of classes) await page.getByRole("checkbox", { name: new RegExp(`${c}`) }).check();
  await shown(page.getByTestId(`n-${classes[0]}`).filter({ hasText: "n =" }), 30_000);
}

describe("Patterns workspace", () => {
  it("a specialist runs Besag's L on FLK and SHD, watches progress, reads the verdicts and sees the plot", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    await openPatterns(page);
    await chooseScope(page, ["FLK", "SHD"]);
    await expect(page.getByTestId("n-FLK").textContent()).resolves.toBe("n = 150");
    await page.getByRole("checkbox", { name: /Clark–Evans/ }).uncheck();
    await page.getByLabel("Global test").selectOption("mad");
    await page.getByLabel("Simulations").fill("99");
    await page.getByLabel(/^Seed/).fill("2026");
    await page.getByRole("button", { name: "Run tests" }).click();
    const result = page.getByTestId("run-result");
    // 99 simulations may end before the first progress event arrives: then the result is what shows.
    // (The next test watches a long run's progress bar.)
    await shown(page.getByRole("progressbar", { name: "Simulations done" }).or(result));
    await shown(result, 60_000);
    const card = (code: string) => page.getByRole("article", { name: `Besag's L under CSR for ${code}` });
    await expect(card("FLK").locator("[data-verdict]").textContent()).resolves.toBe("Clustered");
    await expect(card("SHD").locator("[data-verdict]").textContent()).resolves.toBe("No evidence against the null");
    await expect(card("FLK").textContent()).resolves.toContain("seed 2026");
    const plot = page.getByRole("figure", { name: "L(r) − r, FLK" });
    await shown(plot.locator("svg.recharts-surface path.recharts-curve").first());
    await shown(page.getByText(/Equifinality/));
    // The figure and its curves can be taken away: CSV of the curves, SVG of the drawing.
    const save = async (button: string) => {
      const [download] = await Promise.all([
        page.waitForEvent("download"),
        plot.getByRole("button", { name: button }).click(),
      ]);
      return { name: download.suggestedFilename(), text: await readFile((await download.path())!, "utf8") };
    };
    const csv = await save("CSV");
    expect(csv.name).toBe("l-minus-r-FLK.csv");
    expect(csv.text.split(/\r?\n/)[0]).toBe("r,observed,band_lo,band_hi,null_curve");
    const svg = await save("SVG");
    expect(svg.name).toBe("l-minus-r-FLK.svg");
    expect(svg.text.startsWith("<svg")).toBe(true);
    await page.screenshot({ path: "test-results/patterns-result.png", fullPage: true });
    // The run is saved: a reload of the same address shows it again.
    await page.reload();
    await shown(page.getByTestId("run-result"), 30_000);
    await expect(card("FLK").locator("[data-verdict]").textContent()).resolves.toBe("Clustered");
    await page.context().close();
  });

  it("a specialist watches a long run's progress, reloads the page, finds it still running, and cancels it", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    await openPatterns(page);
    // L, Clark–Evans and pair correlation on four classes, 9999 simulations each: several seconds.
    await chooseScope(page, ["FLK", "SHD", "FCR", "CHP"]);
    await page.getByRole("checkbox", { name: /Pair correlation/ }).check();
    await page.getByLabel("Simulations").fill("9999");
    await page.getByRole("button", { name: "Run tests" }).click();
    const bar = page.getByRole("progressbar", { name: "Simulations done" });
    const percent = async () => Number(await bar.getAttribute("aria-valuenow"));
    await page.waitForFunction(
      () => Number(document.querySelector('[role="progressbar"]')?.getAttribute("aria-valuenow")) > 0,
      undefined,
      { timeout: 30_000 },
    );
    await shown(page.getByText(/% · (about \d+ (s|min)|under a second) left/));
    const before = await percent();
    // The run goes on on the server; the page, reloaded, picks it up where it has got to.
    await page.reload();
    await shown(bar, 30_000);
    await page.waitForFunction(
      (p) => Number(document.querySelector('[role="progressbar"]')?.getAttribute("aria-valuenow")) > p,
      before,
      { timeout: 30_000 },
    );
    await page.getByRole("button", { name: "Cancel run" }).click();
    await shown(page.getByText("This run was cancelled"), 30_000);
    await shown(page.getByRole("table", { name: "Saved runs" }).getByText("cancelled"));
    await page.context().close();
  });

  it("a digger reads the saved runs but has no run button", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    await openPatterns(page);
    await shown(page.getByText(/running tests needs the finds specialist or director role/));
    expect(await page.getByRole("button", { name: "Run tests" }).count()).toBe(0);
    await shown(page.getByRole("table", { name: "Saved runs" }).getByText("done").first());
    await page.context().close();
  });
});
