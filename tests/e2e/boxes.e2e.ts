import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { newPage, openBrowser, shown, signIn } from "./support/browser";

/** The finds store's boxes in the browser: emptying one box into another, and boxes added with no connection. */
let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function openSite(page: Page): Promise<string> {
  await page.getByRole("listitem").filter({ hasText: "Whinnydale Holm" }).getByRole("link").first().click();
  await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/);
  return new URL(page.url()).pathname;
}

async function newBox(page: Page, siteId: string, store: string): Promise<{ id: string; number: number }> {
  const res = await page.request.post(`/api/sites/${siteId}/boxes`, { data: { store } });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()) as { id: string; number: number };
}

describe("the box register", () => {
  it("a finds specialist empties a box into another after confirming how many finds move", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    const site = await openSite(page);
    const siteId = site.split("/")[2]!;
    const [from, into] = [await newBox(page, siteId, "Finds shed, shelf 1"), await newBox(page, siteId, "Store B")];
    const list = await page.request.get(`/api/sites/${siteId}/finds?pageSize=50&sort=number&dir=desc`);
    const rows = ((await list.json()) as { rows: { id: string; processing: string }[] }).rows;
    const picked = rows.filter((f) => f.processing !== "sent").slice(0, 2);
    expect(picked).toHaveLength(2);
    const boxed = await page.request.post(`/api/sites/${siteId}/finds/bulk`, {
      data: { action: "process", findIds: picked.map((f) => f.id), processing: "boxed", boxId: from.id },
    });
    expect(boxed.status(), await boxed.text()).toBe(200);

    await page.goto(`${site}/boxes/${from.id}`);
    await shown(page.getByRole("heading", { name: "Finds in the box (2)" }));
    await page.getByText(`Empty box ${from.number} into another`).click();
    await page.getByLabel("Box to move everything into").selectOption(into.id);
    await page.getByRole("button", { name: `Empty box ${from.number}…` }).click();
    const ask = page.getByRole("alertdialog");
    await shown(ask);
    await expect(ask.textContent()).resolves.toContain(`Move 2 finds from box ${from.number} into box ${into.number}?`);
    await ask.getByRole("button", { name: `Move 2 finds into box ${into.number}` }).click();
    await shown(page.getByText(`Moved 2 finds into box ${into.number}.`));
    await shown(page.getByRole("heading", { name: "Finds in the box (0)" }));
    await page.goto(`${site}/boxes/${into.id}`);
    await shown(page.getByRole("heading", { name: "Finds in the box (2)" }));
    await page.context().close();
  });

  it("a box added with no connection is listed at once, marked as waiting, and joins the register when sent", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    const site = await openSite(page);
    await page.goto(`${site}/boxes`);
    const store = `Finds shed, shelf ${Date.now() % 100_000}`;
    await page.context().setOffline(true);
    await page.getByLabel("Store and place in it").fill(store);
    await page.getByRole("button", { name: "Add a box" }).click();
    const row = page.getByRole("table", { name: "Box register" }).getByRole("row").filter({ hasText: store });
    await shown(row);
    await expect(row.textContent()).resolves.toContain("waiting to be sent from this device");
    expect(await row.getByRole("link").count()).toBe(0);
    await page.context().setOffline(false);
    // Sent when the connection is back: the register shows it as one of its own, with its number and a link.
    await expect
      .poll(async () => (await row.textContent())?.includes("waiting to be sent") ?? true, { timeout: 30_000 })
      .toBe(false);
    await shown(row.getByRole("link"));
    await page.context().close();
  });
});
