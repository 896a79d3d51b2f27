import { appRoutes } from "../support/app-routes";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { APIResponse, Browser, Page } from "playwright-core";
import { DEMO_SITE_CODE } from "@/scripts/seed/seed-demo";
import { baseURL, newPage, openBrowser, shown, signIn } from "./support/browser";
import { takeCspViolations } from "./support/csp-watch";

let browser: Browser;
let page: Page;
const ids: Record<string, string> = {};

/** Every route file of the app as a URL path, with the demo's ids (or a made-up one) in its segments. */
function routesOf(file: "page.tsx" | "route.ts"): string[] {
  return appRoutes(file, (s) => (s === "..." ? "session" : (ids[s] ?? "00000000-0000-4000-8000-000000000001")));
}

function expectSecurityHeaders(res: APIResponse, what: string) {
  const h = res.headers();
  expect(h["content-security-policy"], what).toBeTruthy();
  expect(h["content-security-policy"], what).toMatch(/frame-ancestors 'none'/);
  expect(h["content-security-policy"], what).not.toMatch(/script-src[^;]*'unsafe-inline'/);
  expect(h["x-frame-options"], what).toBe("DENY");
  expect(h["referrer-policy"], what).toBe("same-origin");
  expect(h["permissions-policy"], what).toMatch(/(^|, )camera=\(self\)(,|$)/);
  expect(h["x-content-type-options"], what).toBe("nosniff");
  expect(res.status(), what).toBeLessThan(500);
}

beforeAll(async () => {
  browser = await openBrowser();
  page = await newPage(browser);
  await signIn(page, "director");
  const get = async (url: string) => (await page.request.get(url)).json();
  const sites = (await get("/api/sites")) as { id: string; code: string }[];
  ids.siteId = sites.find((s) => s.code === DEMO_SITE_CODE)!.id;
  const base = `/api/sites/${ids.siteId}`;
  ids.trenchId = (await get(`${base}/trenches`))[0].id;
  ids.contextId = (await get(`${base}/contexts`))[0].id;
  ids.findId = (await get(`${base}/finds`)).rows?.[0]?.id ?? ids.contextId;
  const photos = await get(`${base}/photos`);
  if (photos[0]) ids.photoId = photos[0].id;
  ids.variant = "thumb";
});
afterAll(async () => {
  await browser?.close();
});

describe("security headers on every page and API route of the built app", () => {
  it("every page answers with a nonce policy and the framing, referrer, feature and sniffing rules", async () => {
    const pages = routesOf("page.tsx");
    expect(pages.length).toBeGreaterThan(20);
    const nonces = new Set<string>();
    for (const url of pages) {
      const res = await page.request.get(url, { maxRedirects: 0 });
      expectSecurityHeaders(res, url);
      const nonce = /'nonce-([^']+)'/.exec(res.headers()["content-security-policy"])?.[1];
      expect(nonce, url).toBeTruthy();
      nonces.add(nonce!);
      if (res.status() === 200) {
        // Next's own scripts carry this request's nonce, and none runs without it.
        const html = await res.text();
        const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
        expect(scripts.length, url).toBeGreaterThan(0);
        for (const tag of scripts) expect(tag, url).toContain(`nonce="${nonce}"`);
      }
    }
    expect(nonces.size).toBe(pages.length);
  });

  it("a signed-out visitor's redirect to sign-in carries them too", async () => {
    const res = await fetch(`${baseURL()}/sites/${ids.siteId}`, { redirect: "manual" });
    expect(res.status).toBe(307);
    expect(new URL(res.headers.get("location")!, baseURL()).pathname).toBe("/sign-in");
    expectSecurityHeaders(
      { status: () => res.status, headers: () => Object.fromEntries(res.headers) } as unknown as APIResponse,
      "redirect",
    );
  });

  it("every API route answers with a policy that lets nothing run", async () => {
    const routes = routesOf("route.ts").filter((r) => r.startsWith("/api/"));
    expect(routes).toContain("/api/health");
    for (const url of routes) {
      const res = await page.request.get(url, { maxRedirects: 0 });
      expectSecurityHeaders(res, url);
      expect(res.headers()["content-security-policy"], url).toBe("default-src 'none'; frame-ancestors 'none'");
    }
  });

  it("the service worker answers with its own policy: this origin only, never framed", async () => {
    const res = await page.request.get("/serwist/sw.js", { maxRedirects: 0 });
    expect(res.status()).toBe(200);
    expectSecurityHeaders(res, "/serwist/sw.js");
    expect(res.headers()["content-security-policy"]).toBe(
      "default-src 'self'; object-src 'none'; frame-ancestors 'none'",
    );
    expect(res.headers()["service-worker-allowed"]).toBe("/");
  });
});

describe("a page's policy violation fails the browser test", () => {
  it("the watch reports an image from an origin the policy does not allow", async () => {
    const p = await newPage(browser);
    await signIn(p, "digger");
    await shown(p.getByRole("heading", { level: 1 }));
    const reported = p.waitForEvent("console", { predicate: (m) => m.text().includes("CSP violation") });
    await p.evaluate(() => {
      const img = document.createElement("img");
      img.src = "http://127.0.0.2:9/elsewhere.png";
      document.body.append(img);
    });
    await reported;
    const seen = takeCspViolations();
    expect(seen.some((v) => /img-src blocked http:\/\/127\.0\.0\.2:9\/elsewhere\.png/.test(v))).toBe(true);
    await p.context().close();
  });
});
