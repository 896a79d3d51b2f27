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

describe("panels that summarise a record stay true after a write", () => {
  it("adding a relation on a new sheet clears its sign-off problem, enables Submit and shows in its trail, without a reload", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const [site] = await (await page.request.get("/api/sites")).json();
    const trenches = await (await page.request.get(`/api/sites/${site.id}/trenches`)).json();
    const contexts = await (await page.request.get(`/api/sites/${site.id}/contexts`)).json();
    const taken = new Set(contexts.map((c: { number: number }) => c.number));
    let number = 3700;
    while (taken.has(number)) number++;
    const made = await page.request.post(`/api/sites/${site.id}/contexts`, {
      data: {
        trenchId: trenches.find((t: { code: string }) => t.code === "C").id,
        number,
        type: "layer",
        colour: "mid brown",
        compaction: "firm",
        composition: "silty sand",
        description: "A layer.",
        interpretation: "Subsoil.",
      },
    });
    expect(made.status()).toBe(201);
    const ctx = await made.json();
    await page.goto(`/sites/${site.id}/contexts/${ctx.id}`);
    const problems = page.getByRole("list", { name: "What keeps this sheet from sign-off" });
    await shown(problems.getByText("no stratigraphic relation"));
    const submit = page.getByRole("button", { name: `Submit ${number} for sign-off` });
    expect(await submit.isDisabled()).toBe(true);
    const trail = page.getByRole("region", { name: "Record trail" });
    expect(await trail.getByRole("listitem").count()).toBe(1);

    const loads: string[] = [];
    page.on("load", () => loads.push(page.url()));
    await page.getByLabel("Relation", { exact: true }).selectOption({ label: "below" });
    await page.getByLabel("Other context").selectOption({ label: "3001" });
    await page.getByRole("button", { name: "Add relation" }).click();

    await problems.waitFor({ state: "detached", timeout: 10_000 });
    await expect.poll(() => submit.isDisabled(), { timeout: 10_000 }).toBe(false);
    await shown(trail.getByText(`relation 3001 above ${number}`));
    expect(loads).toEqual([]);
    await page.context().close();
  });
});
