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

/** The openings of zod's own English messages: none may reach a person filling in a form. */
const libraryWords = /Too small|Too big|Invalid input|Invalid option|expected (number|string)|received/;

describe("the context sheet form", () => {
  it("words every refusal for a recorder, naming the field, and never shows a library message", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const [site] = await (await page.request.get("/api/sites")).json();
    await page.goto(`/sites/${site.id}/contexts/new`);
    const form = page.getByRole("form", { name: "Context sheet" });
    await page.getByLabel("Context number").fill("0");
    await page.getByLabel("Length (m)").fill("-2");
    await page
      .getByRole("button", { name: /Save|Open/ })
      .first()
      .click();
    await shown(page.locator("#ctx-number-error").filter({ hasText: "A context number starts at 1." }));
    await shown(page.locator("#ctx-lengthM-error").filter({ hasText: "The length cannot be negative." }));
    await page.getByLabel("Context number").fill("");
    await page.getByLabel("Colour").fill("x".repeat(201));
    await page
      .getByRole("button", { name: /Save|Open/ })
      .first()
      .click();
    await shown(page.locator("#ctx-number-error").filter({ hasText: "Enter a context number." }));
    await shown(page.locator("#ctx-colour-error").filter({ hasText: "Colour is longer than 200 characters" }));
    expect(await form.innerText()).not.toMatch(libraryWords);
    await page.context().close();
  });

  it("shows a saved sheet's trench as fixed, with no list to change it", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const [site] = await (await page.request.get("/api/sites")).json();
    const contexts = await (await page.request.get(`/api/sites/${site.id}/contexts`)).json();
    const trenches = await (await page.request.get(`/api/sites/${site.id}/trenches`)).json();
    const open = contexts.find((c: { state: string }) => c.state === "open");
    const code = trenches.find((t: { id: string }) => t.id === open.trenchId).code;
    await page.goto(`/sites/${site.id}/contexts/${open.id}`);
    await shown(page.getByText("A context stays in the trench it was opened in."));
    expect(await page.getByRole("combobox", { name: "Trench" }).count()).toBe(0);
    expect(await page.getByLabel("Trench", { exact: true }).textContent()).toBe(`Trench ${code}`);
    await page.context().close();
  });
});
