import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { DEMO_USERS } from "@/scripts/seed/seed-demo";
import { baseURL, newPage, openBrowser, shown, signIn } from "./support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("signing in to the demo site", () => {
  for (const user of DEMO_USERS) {
    it(`${user.role} signs in, sees the site with their role, and opens it`, async () => {
      const page = await newPage(browser);
      await signIn(page, user.role);
      const card = page.getByRole("listitem").filter({ hasText: "Whinnydale Holm" });
      await shown(card.getByText(user.role, { exact: true }));
      await card.getByRole("link").click();
      await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/);
      await shown(page.getByRole("heading", { level: 1, name: "Whinnydale Holm" }));
      await shown(page.getByRole("link", { name: "Trench A" }));
      await shown(page.getByRole("navigation", { name: "Site sections" }).getByText(user.role));
      await page.context().close();
    });
  }

  it("refuses a wrong password with a message and stays on the sign-in page", async () => {
    const page = await newPage(browser);
    await page.goto("/sign-in");
    await page.getByLabel("E-mail").fill(DEMO_USERS[0].email);
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await shown(page.getByRole("alert").filter({ hasText: "do not match" }));
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await page.context().close();
  });

  it("sends a signed-out visitor of a site page to sign-in", async () => {
    const page = await newPage(browser);
    await page.goto("/sites");
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    const res = await page.request.get(`${baseURL()}/api/sites`);
    expect(res.status()).toBe(401);
    await page.context().close();
  });
});
