import { chromium, type Browser } from "playwright-core";

/**
 * Debian's chromium (never a downloaded browser), headless, with the flags this machine needs
 * (local-services.md): no sandbox as root, no GPU, and none of the background connections that a closed
 * network refuses. Browser tests, benchmarks and screenshot runs all start it here; `extra` adds flags
 * (the plan benchmark lifts the frame-rate cap). Each launch gets a fresh, empty profile from playwright.
 */
export function launchChromium(extra: readonly string[] = []): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      ...extra,
    ],
  });
}
