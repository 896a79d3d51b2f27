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

/** The computed colours of the page's background and of its secondary text. */
const colours = (page: Page) =>
  page.evaluate(() => ({
    back: getComputedStyle(document.body).backgroundColor,
    soft: getComputedStyle(document.querySelector(".text-ink-soft")!).color,
  }));

describe("field mode", () => {
  it("turns the screens black on white for sunlight, and stays on for the next page and a reload", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    await page.goto("/sites");
    await page.waitForLoadState("networkidle");
    const button = page.getByRole("button", { name: "Field mode" });
    await shown(button);
    expect(await button.getAttribute("aria-pressed")).toBe("false");
    expect(await colours(page)).toEqual({ back: "rgb(247, 242, 232)", soft: "rgb(90, 70, 50)" });

    await button.click();
    expect(await button.getAttribute("aria-pressed")).toBe("true");
    expect(await colours(page)).toEqual({ back: "rgb(255, 255, 255)", soft: "rgb(0, 0, 0)" });

    await page.reload();
    await page.waitForLoadState("networkidle");
    await shown(button);
    expect(await page.evaluate(() => document.documentElement.dataset.fieldMode)).toBe("on");
    expect(await button.getAttribute("aria-pressed")).toBe("true");
    expect(await colours(page)).toEqual({ back: "rgb(255, 255, 255)", soft: "rgb(0, 0, 0)" });

    await button.click();
    expect(await colours(page)).toEqual({ back: "rgb(247, 242, 232)", soft: "rgb(90, 70, 50)" });
    await page.context().close();
  });
});
