import { AxeBuilder } from "@axe-core/playwright";
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

/** The main screens of the demo site, as paths. */
async function mainScreens(page: Page): Promise<[string, string][]> {
  const sites = await (await page.request.get("/api/sites")).json();
  const site = sites.find((s: { code: string }) => s.code === "WHD26");
  const trenches = await (await page.request.get(`/api/sites/${site.id}/trenches`)).json();
  const contexts = await (await page.request.get(`/api/sites/${site.id}/contexts`)).json();
  const finds = await (await page.request.get(`/api/sites/${site.id}/finds?pageSize=1`)).json();
  const s = `/sites/${site.id}`;
  return [
    ["sites", "/sites"],
    ["overview", s],
    ["plan", `${s}/trenches/${trenches[0].id}`],
    ["register", `${s}/finds`],
    ["find", `${s}/finds/${finds.rows[0].id}`],
    ["import", `${s}/finds/import`],
    ["context sheets", `${s}/contexts`],
    ["sheet", `${s}/contexts/${contexts[0].id}`],
    ["matrix", `${s}/contexts/matrix`],
    ["patterns", `${s}/patterns`],
    ["drawings", `${s}/drawings`],
    ["sign-off", `${s}/sign-off`],
    ["people", `${s}/members`],
    ["settings", `${s}/settings`],
    ["record trail", `${s}/audit`],
  ];
}

/** Serious and critical findings of axe-core against WCAG 2.2 A and AA, as "rule: target (summary)" lines. */
async function seriousFindings(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page })
    .withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"])
    .analyze();
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .flatMap((v) =>
      v.nodes.map((n) => `${v.id}: ${n.target.join(" ")} (${n.failureSummary?.split("\n")[1]?.trim() ?? v.help})`),
    );
}

describe("accessibility of the main screens", () => {
  for (const role of ["digger", "specialist", "director"] as const) {
    it(`axe-core finds nothing serious or critical on any main screen, as the ${role}`, async () => {
      const page = await newPage(browser);
      await signIn(page, role);
      const found: string[] = [];
      for (const [name, path] of await mainScreens(page)) {
        await page.goto(path);
        await page.waitForLoadState("networkidle");
        if (name === "plan") await shown(page.getByTestId("plan-canvas"), 20_000);
        for (const line of await seriousFindings(page)) found.push(`${name}: ${line}`);
      }
      expect(found).toEqual([]);
      await page.context().close();
    }, 300_000);
  }
});
