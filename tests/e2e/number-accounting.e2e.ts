/**
 * The printable number accounting (/sites/{siteId}/numbers): every find number from 1 to the highest, as a
 * find, a sample, reserved in a named device's block, void with the reason, or never handed out — the same
 * ranges as GET /api/sites/{siteId}/number-accounting, line for line.
 */
import { randomUUID } from "node:crypto";
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

type Range = {
  first: number;
  last: number;
  status: string;
  holder?: string | null;
  deviceLabel?: string;
  reason?: string;
};

describe("the number accounting on paper", () => {
  it("lists every range the API accounts for, with the holder of a reserved block and the reason of a void one", async () => {
    const page = await newPage(browser);
    await signIn(page, "director");
    const sites = (await (await page.request.get("/api/sites")).json()) as { id: string; code: string }[];
    const site = sites.find((s) => s.code === "WHD26") ?? sites[0]!;
    const base = `/api/sites/${site.id}`;
    // One block held on a named tablet, one given back (its numbers void, with the reason).
    const label = `Tablet ${randomUUID().slice(0, 4)}`;
    const held = await page.request.post(`${base}/number-blocks`, {
      data: { kind: "find", deviceId: randomUUID(), deviceLabel: label },
    });
    expect(held.status()).toBe(201);
    const given = await page.request.post(`${base}/number-blocks`, {
      data: { kind: "find", deviceId: randomUUID(), deviceLabel: "Old tablet" },
    });
    const gone = (await given.json()) as { id: string; first: number };
    const released = await page.request.post(`${base}/number-blocks/${gone.id}/release`, {
      data: { reason: "screen cracked" },
    });
    expect(released.status()).toBe(200);

    const api = (await (await page.request.get(`${base}/number-accounting?kind=find`)).json()) as {
      highest: number;
      ranges: Range[];
    };
    await page.goto(`/sites/${site.id}/numbers`);
    await shown(page.getByRole("heading", { name: "Find numbers" }));
    const rows = await page
      .getByTestId("number-accounting")
      .locator("tbody tr")
      .evaluateAll((trs) =>
        trs.map((tr) => [
          Number(tr.getAttribute("data-first")),
          Number(tr.getAttribute("data-last")),
          tr.getAttribute("data-status"),
        ]),
      );
    expect(rows).toEqual(api.ranges.map((r) => [r.first, r.last, r.status]));
    // Every number from 1 to the highest is on the page exactly once.
    expect(rows[0]![0]).toBe(1);
    for (let i = 1; i < rows.length; i++) expect(rows[i]![0]).toBe((rows[i - 1]![1] as number) + 1);
    expect(rows.at(-1)![1]).toBe(api.highest);

    const heldRow = page.locator(`tbody tr[data-first="${(await held.json()).first}"]`);
    await shown(heldRow.getByText(label, { exact: false }));
    await expect(heldRow.getAttribute("data-status")).resolves.toBe("reserved");
    const voidRow = page.locator(`tbody tr[data-first="${gone.first}"]`);
    await expect(voidRow.getAttribute("data-status")).resolves.toBe("void");
    await shown(voidRow.getByText("Block given back: screen cracked", { exact: false }));
    await page.context().close();
  });
});
