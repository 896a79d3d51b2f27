import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { DEMO_USERS } from "@/lib/demo-users";
import { baseURL, newPage, openBrowser, shown, signIn } from "./support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("a first day on the demo site", () => {
  it("the overview's cautions say where, and link there", async () => {
    const page = await newPage(browser);
    await signIn(page, "director");
    const [site] = await (await page.request.get("/api/sites")).json();
    await page.goto(`/sites/${site.id}`);
    const remains = page.getByRole("alert").filter({ hasText: "Human remains recorded" });
    await shown(remains);
    const where = remains.getByRole("link", { name: /^Find \d+, trench [A-Z]+$/ });
    expect(await where.count()).toBeGreaterThan(0);
    const deep = page.getByRole("alert").filter({ hasText: "Deep trench" });
    await shown(deep);
    const trenchLink = deep.first().getByRole("link", { name: /^Trench [A-Z]+$/ });
    const trenchName = (await trenchLink.textContent())!;
    await trenchLink.click();
    await page.waitForURL(/\/trenches\/[0-9a-f-]{36}$/);
    await shown(page.getByRole("heading", { name: new RegExp(`^${trenchName}`) }));

    await page.goBack();
    const findName = (await where.first().textContent())!;
    await where.first().click();
    await page.waitForURL(/\/finds\/[0-9a-f-]{36}$/);
    await shown(page.getByRole("heading", { name: `Find ${/Find (\d+)/.exec(findName)![1]}` }));
    await page.context().close();
  });

  it("the sign-in page of a demo server lists the demo accounts, and its button says what it does", async () => {
    const page = await newPage(browser);
    await page.goto("/sign-in");
    const demo = page.getByRole("region", { name: "Demo accounts" });
    for (const u of DEMO_USERS) {
      await shown(demo.getByRole("cell", { name: u.email }));
      await shown(demo.getByRole("cell", { name: u.password }));
    }
    await shown(page.getByRole("button", { name: "Sign in", exact: true }));
    await page.context().close();
  });

  it("every page has an icon: the browser's request for /favicon.ico is answered", async () => {
    const res = await fetch(`${baseURL()}/favicon.ico`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/image\//);
    const page = await newPage(browser);
    const missing: string[] = [];
    page.on("response", (r) => {
      if (r.status() === 404) missing.push(r.url());
    });
    await page.goto("/sign-in");
    await page.waitForLoadState("networkidle");
    expect(missing).toEqual([]);
    await page.context().close();
  });
});
