import { readFileSync } from "node:fs";
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

async function openSheet(page: Page, site: string, number: number, description: string) {
  await page.goto(`${site}/contexts/new`);
  await page.getByLabel("Context number").fill(String(number));
  await page.getByLabel("Type").selectOption("layer");
  await page.getByLabel("Colour").fill("mid brown");
  await page.getByLabel("Description").fill(description);
  await page.getByRole("button", { name: "Open the sheet" }).click();
  await page.waitForURL(/\/contexts\/[0-9a-f-]{36}$/);
  await shown(page.getByRole("heading", { level: 1, name: `Context ${number}` }));
  return new URL(page.url()).pathname;
}

async function relate(page: Page, sheet: string, reading: string, other: number) {
  await page.goto(sheet);
  await page.getByLabel("Relation", { exact: true }).selectOption({ label: reading });
  await page.getByLabel("Other context").selectOption({ label: String(other) });
  await page.getByRole("button", { name: "Add relation" }).click();
}

describe("recording: context sheets, the matrix and the register", () => {
  it("a digger records three contexts with relations, is refused a loop, sees the matrix and opens a sheet from it", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const site = await openDemoSite(page);
    const base = 6100 + Math.floor(Math.random() * 800) * 3;
    const [a, b, c] = [base, base + 1, base + 2];
    const sheetA = await openSheet(page, site, a, "Upper silt");
    const sheetB = await openSheet(page, site, b, "Middle silt");
    const sheetC = await openSheet(page, site, c, "Lower silt");

    await relate(page, sheetA, "above", b);
    await shown(page.getByRole("listitem").filter({ hasText: `${a} above ${b}` }));
    // Typed on C's sheet as "below B": the same relation reads "B above C" on B's sheet.
    await relate(page, sheetC, "below", b);
    await shown(page.getByRole("listitem").filter({ hasText: `${c} below ${b}` }));
    await page.goto(sheetB);
    await shown(page.getByRole("listitem").filter({ hasText: `${b} above ${c}` }));
    await shown(page.getByRole("listitem").filter({ hasText: `${b} below ${a}` }));

    // C above A would close a loop: refused, and the message names it.
    await relate(page, sheetC, "above", a);
    await shown(page.getByText(`${c} above ${a} above ${b} above ${c}`));

    await page.getByRole("link", { name: /Matrix of trench/ }).click();
    await page.waitForURL(/\/contexts\/matrix\?trench=/);
    const figure = page.getByRole("figure", { name: "Harris matrix diagram" });
    for (const n of [a, b, c]) await shown(figure.getByRole("link", { name: `Context ${n}` }));
    // Later above earlier: A is drawn higher than B, B higher than C.
    const y = async (n: number) => (await figure.getByRole("link", { name: `Context ${n}` }).boundingBox())!.y;
    expect(await y(a)).toBeLessThan(await y(b));
    expect(await y(b)).toBeLessThan(await y(c));
    await figure.getByRole("link", { name: `Context ${c}` }).click();
    await page.waitForURL(`**${sheetC}`);
    await shown(page.getByRole("heading", { level: 1, name: `Context ${c}` }));
    await page.context().close();
  });

  it("filters the register through the URL and exports exactly what it shows", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    const site = await openDemoSite(page);
    await page.goto(`${site}/finds`);
    await shown(page.getByText("finds match"));
    await page.getByLabel("Context", { exact: true }).selectOption({ label: "1005" });
    await page.waitForURL(/contextId=/);
    await page.getByRole("button", { name: /^x \(m\)/ }).click();
    await page.waitForURL(/sort=x/);
    const status = page.getByText(/\d+ finds? match/);
    expect(await status.textContent()).not.toMatch(/\b1 finds\b/);
    await shown(status);
    const matched = Number((await status.textContent())!.match(/(\d+) finds? match/)![1]);
    expect(matched).toBeGreaterThan(0);
    // The view is in the URL: opening it afresh shows the same filter.
    const shared = page.url();
    const second = await page.context().newPage();
    await second.goto(shared);
    await shown(second.getByText(`${matched} ${matched === 1 ? "find matches" : "finds match"}`));
    expect(await second.getByLabel("Context", { exact: true }).inputValue()).toBe(
      new URL(shared).searchParams.get("contextId"),
    );
    await second.close();

    const [download] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("link", { name: "Export CSV" }).click(),
    ]);
    const lines = readFileSync((await download.path())!, "utf8")
      .trim()
      .split(/\r?\n/);
    expect(lines[0].split(",").slice(0, 4)).toEqual(["number", "trench", "context", "class"]);
    expect(lines.length - 1).toBe(matched);
    expect(new Set(lines.slice(1).map((l) => l.split(",")[2]))).toEqual(new Set(["1005"]));
    const xs = lines.slice(1).map((l) => Number(l.split(",")[4]));
    expect(xs).toEqual([...xs].sort((p, q) => p - q));
    await page.context().close();
  });
});
