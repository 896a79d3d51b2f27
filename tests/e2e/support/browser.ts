import type { Browser, Page } from "playwright-core";
import { launchChromium } from "@/scripts/chromium";
import { inject } from "vitest";
import { watchCsp } from "./csp-watch";

export const baseURL = () => inject("baseURL");

/**
 * Debian's chromium, never a downloaded browser (local-services.md lists the flags this machine needs).
 * playwright gives every launch a fresh, empty profile of its own. Every context it opens is watched for
 * Content Security Policy violations (csp-watch.ts), which fail the test.
 */
export async function openBrowser(): Promise<Browser> {
  const browser = await launchChromium();
  const newContext = browser.newContext.bind(browser);
  browser.newContext = async (options) => {
    const context = await newContext(options);
    await watchCsp(context);
    return context;
  };
  return browser;
}

export const viewports = { desktop: { width: 1366, height: 900 }, tablet: { width: 820, height: 1180 } } as const;

export async function newPage(browser: Browser, size: keyof typeof viewports = "desktop"): Promise<Page> {
  const context = await browser.newContext({
    baseURL: baseURL(),
    viewport: viewports[size],
    hasTouch: size === "tablet",
  });
  return context.newPage();
}

/** Signs in through the real form as one of the demo users (the same steps the benchmarks take). */
export { signInDemo as signIn } from "@/scripts/sign-in-demo";

/** From the sites list, opens the demo site (Whinnydale Holm) and returns its base address. */
export async function openDemoSite(page: Page): Promise<string> {
  await page.getByRole("listitem").filter({ hasText: "Whinnydale Holm" }).getByRole("link").first().click();
  await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/);
  return new URL(page.url()).pathname;
}

/** Waits up to `timeout` ms for the locator to show; fails the test naming what was missing. */
export async function shown(locator: import("playwright-core").Locator, timeout = 10_000): Promise<void> {
  try {
    await locator.first().waitFor({ state: "visible", timeout });
  } catch {
    throw new Error(`expected to see ${String(locator)} within ${timeout} ms`);
  }
}
