import jsQR from "jsqr";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { labelPath, parseLabelCode } from "@/lib/labels/code";
import { newPage, openBrowser, shown, signIn } from "./support/browser";
import { freshTrench } from "./support/plan-trench";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** A complete context sheet in the trench, through the JSON API, as a digger records one. */
async function newContext(page: Page, siteId: string, trenchId: string, number: number) {
  const res = await page.request.post(`/api/sites/${siteId}/contexts`, {
    data: {
      trenchId,
      number,
      type: "layer",
      colour: "mid brown",
      compaction: "firm",
      composition: "silty sand",
      description: "A layer.",
      interpretation: "Fill.",
    },
  });
  expect(res.status()).toBe(201);
  return (await res.json()) as { id: string; number: number };
}

async function newFind(page: Page, siteId: string, contextId: string, classId: string, x: number) {
  const res = await page.request.post(`/api/sites/${siteId}/finds`, {
    data: { contextId, classId, x, y: 1, method: "plan" },
  });
  expect(res.status()).toBe(201);
  return (await res.json()) as { id: string; number: number };
}

async function contextOf(page: Page, siteId: string, findId: string) {
  return ((await (await page.request.get(`/api/sites/${siteId}/finds/${findId}`)).json()) as { contextId: string })
    .contextId;
}

describe("the finds register: many finds at once", () => {
  it("a digger picks three finds and moves them, is refused a locked find by name, boxes them, prints the box label and deletes a box made by mistake", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const t = await freshTrench(page);
    const site = t.siteId;
    const classes = (await (await page.request.get(`/api/sites/${site}/classes`)).json()) as {
      id: string;
      code: string;
    }[];
    const cls = classes[0]!;
    const base = 90_000 + Math.floor(Math.random() * 9_000) * 3;
    const [from, to, held] = [
      await newContext(page, site, t.trenchId, base),
      await newContext(page, site, t.trenchId, base + 1),
      await newContext(page, site, t.trenchId, base + 2),
    ];
    const picked = [
      await newFind(page, site, from.id, cls.id, 1.5),
      await newFind(page, site, from.id, cls.id, 2),
      await newFind(page, site, from.id, cls.id, 2.5),
    ];
    const locked = await newFind(page, site, held.id, cls.id, 3);
    expect(
      (
        await page.request.post(`/api/sites/${site}/relations`, {
          data: { contextId: held.id, reading: "below", otherId: from.id },
        })
      ).status(),
    ).toBe(201);
    expect((await page.request.post(`/api/sites/${site}/sign-off/${held.id}/submit`)).status()).toBe(200);

    // Three finds picked by hand: the first, then shift and the third takes the one between.
    await page.goto(`/sites/${site}/finds?contextId=${from.id}`);
    const table = page.getByRole("table", { name: "Finds register" });
    await shown(table.getByRole("button", { name: String(picked[2]!.number), exact: true }));
    await page.getByLabel(`Pick find ${picked[0]!.number}`).click();
    await page.getByLabel(`Pick find ${picked[2]!.number}`).click({ modifiers: ["Shift"] });
    const bar = page.getByRole("region", { name: "Change the finds picked" });
    await shown(bar.getByText("3 finds picked"));
    await bar.getByLabel("Change", { exact: true }).selectOption("move");
    await bar.getByLabel("Move to context").selectOption({ label: String(to.number) });
    await bar.getByRole("button", { name: "Move to another context: 3 finds" }).click();
    await shown(page.getByText(/Done: 3 finds changed/));
    for (const f of picked) expect(await contextOf(page, site, f.id)).toBe(to.id);
    await page.goto(`/sites/${site}/finds?contextId=${to.id}`);
    for (const f of picked)
      await shown(
        page
          .getByRole("table", { name: "Finds register" })
          .getByRole("button", { name: String(f.number), exact: true }),
      );

    // The find of the context awaiting sign-off: refused by name, and nothing moves.
    await page.goto(`/sites/${site}/finds?contextId=${held.id}`);
    await page.getByRole("button", { name: "Pick all 1 find that match" }).click();
    await shown(bar.getByText("1 find picked"));
    await bar.getByLabel("Change", { exact: true }).selectOption("move");
    // The picker offers only contexts open to new finds: not the one awaiting sign-off.
    const offered = await bar.getByLabel("Move to context").locator("option").allTextContents();
    expect(offered).toContain(String(to.number));
    expect(offered).not.toContain(String(held.number));
    await bar.getByLabel("Move to context").selectOption({ label: String(to.number) });
    await bar.getByRole("button", { name: "Move to another context: 1 find" }).click();
    const refusal = page.getByRole("alert").filter({ hasText: "No find was moved" });
    await shown(refusal);
    expect(await refusal.textContent()).toContain(`find ${locked.number}: Context ${held.number} was submitted`);
    expect(await contextOf(page, site, locked.id)).toBe(held.id);

    // A new box, the three finds boxed in it, and its label lists them.
    await page.goto(`/sites/${site}/boxes`);
    await page.getByLabel("Store and place in it").fill(`Finds store, bay ${base}`);
    await page.getByRole("button", { name: "Add a box" }).click();
    const added = page.getByText(/Box \d+ added\./);
    await shown(added);
    const boxNumber = Number(/Box (\d+) added/.exec((await added.textContent()) ?? "")?.[1]);
    await page.goto(`/sites/${site}/finds?contextId=${to.id}`);
    await page.getByRole("button", { name: "Pick all 3 finds that match" }).click();
    await bar.getByLabel("Change", { exact: true }).selectOption("process");
    await bar.getByLabel("Processing", { exact: true }).selectOption("boxed");
    await bar.getByLabel("Box", { exact: true }).selectOption({ label: `Box ${boxNumber} · Finds store, bay ${base}` });
    await bar.getByRole("button", { name: "Processing and box: 3 finds" }).click();
    await shown(page.getByText(/Done: 3 finds changed/));

    await page.goto(`/sites/${site}/boxes`);
    await page.locator(`tr[data-box="${boxNumber}"]`).getByRole("link").click();
    await shown(page.getByRole("heading", { level: 1, name: `Box ${boxNumber}` }));
    const boxPath = new URL(page.url()).pathname;
    await page.getByRole("link", { name: "Print the box label" }).click();
    const label = page.locator(".label-box").first();
    await shown(label);
    const listed = label.getByRole("list", { name: `In box ${boxNumber}` });
    for (const f of picked) await shown(listed.getByText(`F${f.number} ${cls.code} · ctx ${to.number}`));
    // The code read from the printed label leads to the box page.
    await page.emulateMedia({ media: "print" });
    const png = await label.screenshot({ scale: "device" });
    await page.emulateMedia({ media: "screen" });
    const { data, info } = await sharp(png).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
    const text = jsQR(
      new Uint8ClampedArray(data.buffer, data.byteOffset, data.byteLength),
      info.width,
      info.height,
    )?.data;
    const ref = parseLabelCode(text ?? "");
    expect(ref, `decoded: ${text}`).toMatchObject({ kind: "B", number: boxNumber });
    await page.goto(labelPath(ref!));
    await page.waitForURL(`**${boxPath}`);

    // The full box cannot be deleted: the page says what it holds. An empty box made by mistake goes.
    await page
      .locator("summary")
      .filter({ hasText: `Delete box ${boxNumber}` })
      .click();
    await shown(page.getByText(`Box ${boxNumber} still holds 3 finds; only an empty box can be deleted.`));
    expect(await page.getByRole("button", { name: `Delete box ${boxNumber}` }).isDisabled()).toBe(true);
    await page.goto(`/sites/${site}/boxes`);
    await page.getByLabel("Store and place in it").fill(`Made by mistake ${base}`);
    await page.getByRole("button", { name: "Add a box" }).click();
    const mistake = page.getByText(/Box \d+ added\./);
    await shown(mistake);
    const mistakeNumber = Number(/Box (\d+) added/.exec((await mistake.textContent()) ?? "")?.[1]);
    await page.locator(`tr[data-box="${mistakeNumber}"]`).getByRole("link").click();
    await shown(page.getByRole("heading", { level: 1, name: `Box ${mistakeNumber}` }));
    await page
      .locator("summary")
      .filter({ hasText: `Delete box ${mistakeNumber}` })
      .click();
    await page.getByRole("button", { name: `Delete box ${mistakeNumber}` }).click();
    await page.waitForURL(`**/sites/${site}/boxes`);
    await shown(page.getByRole("heading", { level: 1, name: "Box register" }));
    expect(await page.locator(`tr[data-box="${mistakeNumber}"]`).count()).toBe(0);
    await page.context().close();
  });
});
