/**
 * A finds specialist in the Patterns workspace: picks a scope, runs, watches progress, reads the verdict
 * and sees the plot; the run survives a reload; a run can be cancelled; a digger reads but cannot run.
 * Fewer simulations than the default (99) keep the test short; FLK's clustering and SHD's randomness in
 * the demo (scripts/seed/seed-demo.ts) are decided at that number too (see tests/integration/patterns-verdicts).
 */
import { readFile } from "node:fs/promises";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { newPage, openBrowser, openDemoSite, shown, signIn } from "./support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function openPatterns(page: Page) {
  await openDemoSite(page);
  await page.getByRole("navigation", { name: "Site sections" }).getByRole("link", { name: "Patterns" }).click();
  await shown(page.getByRole("heading", { level: 1, name: "Patterns" }));
}

async function chooseScope(page: Page, classes: string[]) {
  await page.getByRole("checkbox", { name: /^1005/ }).check();
  for (const c of classes) await page.getByRole("checkbox", { name: new RegExp(`${c}`) }).check();
  await shown(page.getByTestId(`n-${classes[0]}`).filter({ hasText: "n =" }), 30_000);
}

/** Tests and settings are folded under the scope; a specialist unfolds them to change the defaults. */
async function unfoldSettings(page: Page) {
  await page.getByTestId("run-settings").locator("summary").click();
  await shown(page.getByLabel("Simulations"));
}

describe("Patterns workspace", () => {
  it("a specialist runs Besag's L on FLK and SHD, watches progress, reads the verdicts and sees the plot", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    await openPatterns(page);
    await chooseScope(page, ["FLK", "SHD"]);
    await expect(page.getByTestId("n-FLK").textContent()).resolves.toBe("n = 150");
    await unfoldSettings(page);
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
    // The answer in plain words first; the test's own terms in the detail line; p once per result.
    await expect(card("FLK").locator("[data-verdict]").textContent()).resolves.toBe("Grouped together");
    await expect(card("SHD").locator("[data-verdict]").textContent()).resolves.toBe("No clear pattern");
    const plain = result.getByTestId("plain-sentences").getByRole("listitem");
    await expect(plain.allTextContents()).resolves.toEqual([
      expect.stringMatching(
        /^Flint flake \(FLK\) finds lie in groups, (roughly up to [\d.]+ m across|closer together than chance would give)\.$/,
      ),
      "Pottery sherd (SHD) finds show no clear pattern: chance alone could have laid them out like this.",
    ]);
    await expect(card("SHD").textContent()).resolves.toContain("No evidence against CSR at the 5 % level.");
    for (const code of ["FLK", "SHD"]) {
      const text = (await card(code).textContent())!;
      expect(text.match(/p (=|<) ?[\d.e<-]+/g)).toHaveLength(1);
    }
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
    await expect(card("FLK").locator("[data-verdict]").textContent()).resolves.toBe("Grouped together");
    await page.context().close();
  });

  it("the default tests run with one action once the scope is chosen; the settings stay folded", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    await openPatterns(page);
    await chooseScope(page, ["SHD"]);
    const settings = page.getByTestId("run-settings");
    await expect(settings.getAttribute("open")).resolves.toBeNull();
    expect(await page.getByLabel("Simulations").isVisible()).toBe(false);
    await shown(settings.getByText(/Besag's L, Clark–Evans; 999 simulations, 5 % level/));
    await page.getByRole("button", { name: "Run tests" }).click();
    const result = page.getByTestId("run-result");
    await shown(result, 60_000);
    await shown(page.getByRole("article", { name: "Besag's L under CSR for SHD" }));
    await shown(page.getByRole("article", { name: "Clark–Evans for SHD" }));
    await page.context().close();
  });

  it("quadrat counts are drawn where they were taken: each cell on the trench, observed and expected", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    await openPatterns(page);
    await chooseScope(page, ["FLK"]);
    await unfoldSettings(page);
    await page.getByRole("checkbox", { name: /Besag's L/ }).uncheck();
    await page.getByRole("checkbox", { name: /Clark–Evans/ }).uncheck();
    await page.getByRole("checkbox", { name: /Quadrat counts/ }).check();
    await page.getByLabel("Simulations").fill("99");
    await page.getByRole("button", { name: "Run tests" }).click();
    await shown(page.getByTestId("run-result"), 60_000);
    const map = page.getByRole("img", {
      name: "Quadrat counts of FLK on the trench plan, observed and expected per cell",
    });
    await shown(map);
    // Every cell says what was observed and expected there; the observed counts add up to the class's finds
    // in the scope, and so, near enough, do the expected ones.
    const titles = await map.locator("g[data-square] > title").allTextContents();
    expect(titles.length).toBeGreaterThan(4);
    const pairs = titles.map((t) => {
      const m = /observed (\d+), expected ([\d.]+)$/.exec(t);
      expect(m, t).not.toBeNull();
      return [Number(m![1]), Number(m![2])];
    });
    expect(pairs.reduce((s, [o]) => s + o!, 0)).toBe(150);
    const expected = pairs.reduce((s, [, e]) => s + e!, 0);
    expect(Math.abs(expected - 150)).toBeLessThan(titles.length * 0.05 + 0.5);
    // Each label fits inside its own cell, so neighbouring numbers do not run into each other.
    const overflows = await map.evaluate((svg) =>
      [...svg.querySelectorAll("g[data-square]")].flatMap((g) => {
        const text = g.querySelector("text");
        const cell = g.querySelector("rect")!.getBBox();
        return text && text.getBBox().width > cell.width ? [text.textContent] : [];
      }),
    );
    expect(overflows).toEqual([]);
    await map.screenshot({ path: "test-results/quadrat-on-plan.png" });
    await page.context().close();
  });

  it("a specialist limits the scope by reduced level: the spread per class, the narrower n, a reversed range refused", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    await openPatterns(page);
    await chooseScope(page, ["FLK"]);
    await expect(page.getByTestId("n-FLK").textContent()).resolves.toBe("n = 150");
    // The demo's trench A finds lie 0.30–0.40 m below its surface (RL 49.62): within the 0.20 m default.
    await shown(page.getByTestId("vertical-spread").locator('[data-class="FLK"]'));
    await shown(page.getByText(/No class spreads over more than 0\.20 m \(common practice\)/));
    await page.getByLabel("Lowest level (RL, m)").fill("49.270");
    await page.getByLabel("Highest level (RL, m)").fill("49.320");
    await shown(page.getByTestId("depth-scope").getByText("RL 49.270 to 49.320 m"));
    await expect
      .poll(async () => Number((await page.getByTestId("n-FLK").textContent())?.replace("n = ", "")), {
        timeout: 20_000,
      })
      .toBeLessThan(150);
    await page.getByLabel("Lowest level (RL, m)").fill("49.400");
    await shown(page.getByText("The lower level (from) must not be higher than the upper level (to)."));
    await page.context().close();
  });

  it("a specialist watches a long run's progress, reloads the page, finds it still running, and cancels it", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    await openPatterns(page);
    // L, Clark–Evans and pair correlation on four classes, 9999 simulations each: several seconds.
    await chooseScope(page, ["FLK", "SHD", "FCR", "CHP"]);
    await unfoldSettings(page);
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
