/**
 * `npm run screens`: screenshots of Loamwork's main screens at desktop, tablet and phone sizes, taken from
 * the built app on its own seeded demo data, for a person to look at after a change to the screens. Each
 * screen is opened as the role that works there; the files go to test-results/screens/<size>-<screen>.png.
 * Not a test: it asserts nothing beyond the page opening; it prints which files it wrote and, for a page
 * wider than the screen, what sticks out.
 */
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { launchChromium } from "./chromium";
import type { DEMO_USERS } from "@/lib/demo-users";
import { signInDemo } from "./sign-in-demo";
import { ensureBuilt, startStack } from "./stack";

const port = Number(process.env.SCREENS_PORT ?? 3392);
const out = path.resolve("test-results/screens");
const sizes = {
  desktop: { width: 1366, height: 900, touch: false },
  tablet: { width: 820, height: 1180, touch: true },
  phone: { width: 390, height: 844, touch: true },
} as const;
type Role = (typeof DEMO_USERS)[number]["role"];

/** Screen name → who opens it and where, given the demo site's and trench A's ids. */
const screens: { name: string; role: Role; path: (site: string, trench: string) => string }[] = [
  { name: "sites", role: "digger", path: () => "/sites" },
  { name: "overview", role: "digger", path: (s) => `/sites/${s}` },
  { name: "plan", role: "digger", path: (s, t) => `/sites/${s}/trenches/${t}` },
  { name: "finds-register", role: "digger", path: (s) => `/sites/${s}/finds` },
  { name: "context-sheets", role: "digger", path: (s) => `/sites/${s}/contexts` },
  { name: "level-book", role: "digger", path: (s) => `/sites/${s}/levels` },
  { name: "samples", role: "digger", path: (s) => `/sites/${s}/samples` },
  { name: "patterns", role: "specialist", path: (s) => `/sites/${s}/patterns` },
  { name: "sign-off", role: "director", path: (s) => `/sites/${s}/sign-off` },
  { name: "settings", role: "director", path: (s) => `/sites/${s}/settings` },
];

async function main() {
  ensureBuilt();
  const dataDir = path.join(".tmp", "screens");
  rmSync(dataDir, { recursive: true, force: true });
  rmSync(out, { recursive: true, force: true });
  mkdirSync(out, { recursive: true });
  const stack = await startStack({ port, dataDir, quiet: true });
  const browser = await launchChromium();
  try {
    for (const [size, v] of Object.entries(sizes)) {
      for (const role of ["digger", "specialist", "director"] as const) {
        const context = await browser.newContext({
          baseURL: stack.url,
          viewport: { width: v.width, height: v.height },
          hasTouch: v.touch,
          isMobile: size === "phone",
        });
        const page = await context.newPage();
        await signInDemo(page, role);
        const sites = (await (await page.request.get("/api/sites")).json()) as { id: string; code: string }[];
        const site = sites.find((s) => s.code === "WHD26")!;
        const trenches = (await (await page.request.get(`/api/sites/${site.id}/trenches`)).json()) as {
          id: string;
          code: string;
        }[];
        const trench = trenches.find((t) => t.code === "A")!;
        for (const s of screens.filter((x) => x.role === role)) {
          await page.goto(s.path(site.id, trench.id));
          await page.waitForLoadState("networkidle");
          await page.waitForTimeout(500);
          const file = path.join(out, `${size}-${s.name}.png`);
          await page.screenshot({ path: file, fullPage: true });
          // A page wider than the screen scrolls sideways: name the outermost elements that stick out.
          const wide = await page.evaluate(() => {
            const w = document.documentElement.clientWidth;
            if (document.documentElement.scrollWidth <= w) return [];
            // Inside a box that scrolls on its own, sticking out is fine: only the page must not scroll.
            const clipped = (e: HTMLElement) => {
              for (let p = e.parentElement; p; p = p.parentElement)
                if (["auto", "scroll", "hidden"].includes(getComputedStyle(p).overflowX)) return true;
              return false;
            };
            const over = [...document.querySelectorAll<HTMLElement>("body *")].filter(
              (e) => e.getBoundingClientRect().right > w + 1 && !clipped(e),
            );
            const outer = over.filter((e) => !over.some((o) => o !== e && o.contains(e) && o.tagName !== "MAIN"));
            return outer
              .slice(0, 4)
              .map(
                (e) =>
                  `${e.tagName.toLowerCase()}${e.getAttribute("aria-label") ? `[${e.getAttribute("aria-label")}]` : ""} to ${Math.round(e.getBoundingClientRect().right)} px`,
              );
          });
          console.log(file, wide.length ? `scrolls sideways: ${wide.join(", ")}` : "");
        }
        await context.close();
      }
    }
  } finally {
    await browser.close();
    await stack.stop();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
