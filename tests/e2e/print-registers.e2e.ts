/**
 * The printed registers (/sites/{siteId}/print/…): reached from each register's screen, they list the
 * register's records (unsigned ones marked), close with the number accounting, carry the site code in the
 * page margins, and print without the app's header. A person who is not a member of the site finds nothing.
 */
import { randomUUID } from "node:crypto";
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

const registers = [
  { path: "contexts", screen: "contexts", link: "Print the register", testId: "printed-contexts" },
  { path: "finds", screen: "finds", link: "Print the register", testId: "printed-finds" },
  { path: "samples", screen: "samples", link: "Print the register", testId: "printed-samples" },
  { path: "levels", screen: "levels", link: "Level book to print", testId: "printed-levels" },
] as const;

type Ctx = { id: string; number: number; state: string };

async function demoSite(page: Page) {
  const sites = (await (await page.request.get("/api/sites")).json()) as { id: string; code: string }[];
  return sites.find((s) => s.code === "WHD26") ?? sites[0]!;
}

/** [number, signed off] of every register row on the page, in order. */
const rowsOf = (page: Page, testId: string) =>
  page
    .getByTestId(testId)
    .locator("table[aria-label$='register'] tbody tr")
    .evaluateAll((trs) =>
      trs.map((tr) => [Number(tr.getAttribute("data-number")), tr.getAttribute("data-signed-off") === "true"]),
    );

describe("printed registers", () => {
  it("each is linked from its register and lists the register's records, unsigned ones marked, then the accounting", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const site = await demoSite(page);
    const base = `/api/sites/${site.id}`;
    const contexts = (await (await page.request.get(`${base}/contexts`)).json()) as Ctx[];
    const open = contexts.find((c) => c.state === "open")!;
    const made = await page.request.post(`${base}/samples`, {
      data: { contextId: open.id, type: "bulk", purpose: "flotation", volumeL: 20 },
      headers: { "Idempotency-Key": randomUUID() },
    });
    expect(made.status(), await made.text()).toBe(201);
    const sample = (await made.json()) as { number: number };

    for (const r of registers) {
      await page.goto(`/sites/${site.id}/${r.screen}`);
      await page.getByRole("link", { name: r.link }).click();
      await page.waitForURL(`**/sites/${site.id}/print/${r.path}`);
      await shown(page.getByTestId(r.testId));
      // The site code goes into the top margin of every printed sheet, page numbers into the foot.
      const css = await page.getByTestId(r.testId).locator("style").textContent();
      expect(css).toContain(`@top-left { content: "${site.code} `);
      expect(css).toContain('counter(page) " of " counter(pages)');
    }

    await page.goto(`/sites/${site.id}/print/contexts`);
    expect(await rowsOf(page, "printed-contexts")).toEqual(
      [...contexts].sort((a, b) => a.number - b.number).map((c) => [c.number, c.state === "signed_off"]),
    );
    await shown(page.getByTestId("printed-contexts").locator("[data-sequence='context']"));

    await page.goto(`/sites/${site.id}/print/finds`);
    const finds = (await (await page.request.get(`${base}/finds`)).json()) as { total: number };
    const findRows = await rowsOf(page, "printed-finds");
    expect(findRows).toHaveLength(finds.total);
    expect(findRows.map((f) => f[0])).toEqual([...findRows.map((f) => f[0] as number)].sort((a, b) => a - b));
    const used = await page.locator("[data-sequence='find'] [data-total='find']").textContent();
    expect(Number(used)).toBe(finds.total);

    await page.goto(`/sites/${site.id}/print/samples`);
    const sampleRow = page.locator(`table[aria-label='Samples register'] tr[data-number="${sample.number}"]`);
    await shown(sampleRow.getByText("NOT SIGNED OFF"));
    await shown(sampleRow.getByText("flotation"));
    // The accounting joins used numbers into ranges: the new sample's number lies in one of the samples' ranges.
    const ranges = await page
      .locator("[data-sequence] tr[data-status='sample']")
      .evaluateAll((rows) =>
        rows.map((r) => [Number(r.getAttribute("data-first")), Number(r.getAttribute("data-last"))]),
      );
    expect(
      ranges.some(([first, last]) => first! <= sample.number && sample.number <= last!),
      JSON.stringify(ranges),
    ).toBe(true);

    await page.goto(`/sites/${site.id}/print/levels`);
    await shown(page.locator("[data-run] [data-check]").first());
    expect(await page.locator("[data-run]").count()).toBeGreaterThan(0);

    // On paper the app's header, the site navigation and the buttons are left off.
    await page.emulateMedia({ media: "print" });
    expect(await page.getByRole("button", { name: "Print the level book" }).isVisible()).toBe(false);
    expect(await page.getByRole("link", { name: "Back to the level book" }).isVisible()).toBe(false);
    expect(await page.locator("header.no-print").first().isVisible()).toBe(false);
    await shown(page.getByRole("heading", { name: "Level book" }));
    await page.context().close();
  });

  it("a person who is not a member of the site gets not found on every printed register", async () => {
    const director = await newPage(browser);
    await signIn(director, "director");
    // Its code sorts after the demo site's: the other browser tests take the director's first site (by code).
    const created = await director.request.post("/api/sites", {
      data: { code: `ZZ-${randomUUID().slice(0, 6)}`, name: "Printed registers test site" },
    });
    expect(created.status(), await created.text()).toBe(201);
    const { id } = (await created.json()) as { id: string };
    const own = await director.goto(`/sites/${id}/print/finds`);
    expect(own?.status()).toBe(200);
    await director.context().close();

    const digger = await newPage(browser);
    await signIn(digger, "digger");
    for (const r of registers) {
      const res = await digger.goto(`/sites/${id}/print/${r.path}`);
      expect(res?.status(), r.path).toBe(404);
      expect(await digger.getByTestId(r.testId).count()).toBe(0);
    }
    await digger.context().close();
  });
});
