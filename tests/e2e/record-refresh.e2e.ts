import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { newPage, openBrowser, shown, signIn } from "./support/browser";
import { freshContext } from "./support/fresh-context";

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
    const { siteId, contextId, number } = await freshContext(page, {
      type: "layer",
      colour: "mid brown",
      compaction: "firm",
      composition: "silty sand",
      description: "A layer.",
      interpretation: "Subsoil.",
    });
    await page.goto(`/sites/${siteId}/contexts/${contextId}`);
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
