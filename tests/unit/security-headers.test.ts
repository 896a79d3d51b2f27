import { appRoutes } from "../support/app-routes";
import { describe, expect, it } from "vitest";
import { NextRequest } from "next/server";
import { unstable_doesMiddlewareMatch } from "next/experimental/testing/server";
import nextConfig from "@/next.config";
import { config as proxyConfig, proxy } from "@/proxy";
import {
  API_CONTENT_SECURITY_POLICY,
  SERVICE_WORKER_CONTENT_SECURITY_POLICY,
  pageContentSecurityPolicy,
  securityHeaders,
  uploadOrigin,
} from "@/lib/security-headers";

const UPLOAD_STAND_IN = "http://127.0.0.1:4321";
process.env.UPLOADTHING_INGEST_URL = `${UPLOAD_STAND_IN}/ingest`;

/** One directive's sources, e.g. directive(policy, "script-src") → ["'self'", "'nonce-…'", …]. */
function directive(policy: string, name: string): string[] | undefined {
  const found = policy
    .split(";")
    .map((d) => d.trim().split(/\s+/))
    .find(([n]) => n === name);
  return found?.slice(1);
}

/** Every route file of the app, as a URL path with made-up ids in its dynamic segments. */
function routesOf(file: "page.tsx" | "route.ts"): string[] {
  return appRoutes(file, (s) => (s === "..." ? "a/b" : "00000000-0000-4000-8000-000000000001"));
}

describe("the page policy", () => {
  const policy = pageContentSecurityPolicy({
    nonce: "bm9uY2U=",
    connectOrigins: [uploadOrigin(`${UPLOAD_STAND_IN}/x`)],
  });

  it("lets scripts run only with the request's nonce, never inline", () => {
    expect(directive(policy, "script-src")).toEqual(["'self'", "'nonce-bm9uY2U='", "'strict-dynamic'"]);
    expect(policy).not.toMatch(/script-src[^;]*'unsafe-inline'/);
    expect(policy).not.toMatch(/'unsafe-eval'/);
    expect(pageContentSecurityPolicy({ nonce: "n", dev: true })).toMatch(/script-src [^;]*'unsafe-eval'/);
  });

  it("allows what the app needs and nothing frames it", () => {
    expect(directive(policy, "frame-ancestors")).toEqual(["'none'"]);
    expect(directive(policy, "img-src")).toEqual(["'self'", "blob:", "data:"]);
    expect(directive(policy, "worker-src")).toEqual(["'self'"]);
    expect(directive(policy, "manifest-src")).toEqual(["'self'"]);
    expect(directive(policy, "connect-src")).toEqual(["'self'", UPLOAD_STAND_IN]);
    expect(directive(policy, "object-src")).toEqual(["'none'"]);
    // Inline styles are allowed, so the style policy must carry no nonce (a nonce would cancel 'unsafe-inline').
    expect(directive(policy, "style-src")).toEqual(["'self'", "'unsafe-inline'"]);
  });

  it("falls back to the hosted upload service when no ingest URL is configured", () => {
    expect(uploadOrigin(undefined)).toBe("https://*.ingest.uploadthing.com");
  });

  it("sends framing, referrer, feature and sniffing rules beside the policy", () => {
    const headers = securityHeaders("default-src 'none'");
    expect(headers["X-Frame-Options"]).toBe("DENY");
    expect(headers["Referrer-Policy"]).toBe("same-origin");
    expect(headers["X-Content-Type-Options"]).toBe("nosniff");
    const features = headers["Permissions-Policy"].split(", ");
    expect(features).toContain("camera=(self)");
    expect(features.filter((f) => f !== "camera=(self)").every((f) => f.endsWith("=()"))).toBe(true);
    expect(features).toEqual(expect.arrayContaining(["microphone=()", "geolocation=()"]));
  });
});

describe("every page and every API route answers with the security headers", () => {
  const pages = routesOf("page.tsx");
  const routes = routesOf("route.ts");
  const apiRoutes = routes.filter((r) => r.startsWith("/api/"));

  it("finds the app's pages and routes", () => {
    expect(pages).toContain("/sign-in");
    expect(pages).toContain(
      "/sites/00000000-0000-4000-8000-000000000001/trenches/00000000-0000-4000-8000-000000000001",
    );
    expect(apiRoutes).toContain("/api/health");
  });

  for (const page of pages) {
    it(`page ${page}: the proxy runs and sets a fresh nonce policy`, () => {
      expect(unstable_doesMiddlewareMatch({ config: proxyConfig, url: page })).toBe(true);
      const nonces = [0, 1].map(() => {
        const res = proxy(
          new NextRequest(`http://localhost${page}`, { headers: { cookie: "authjs.session-token=x" } }),
        );
        const policy = res.headers.get("content-security-policy") ?? "";
        const nonce = res.headers.get("x-middleware-request-x-nonce");
        expect(nonce).toBeTruthy();
        expect(directive(policy, "script-src")).toContain(`'nonce-${nonce}'`);
        // Next reads the nonce for its own scripts from the request's policy header.
        expect(res.headers.get("x-middleware-request-content-security-policy")).toBe(policy);
        expect(res.headers.get("x-frame-options")).toBe("DENY");
        expect(res.headers.get("permissions-policy")).toMatch(/camera=\(self\)/);
        expect(res.headers.get("referrer-policy")).toBe("same-origin");
        expect(res.headers.get("x-content-type-options")).toBe("nosniff");
        return nonce;
      });
      expect(nonces[0]).not.toBe(nonces[1]);
    });
  }

  it("still sends site pages without a session to sign-in, with the headers", () => {
    const res = proxy(new NextRequest("http://localhost/sites/abc/finds"));
    expect(res.status).toBe(307);
    expect(new URL(res.headers.get("location")!).pathname).toBe("/sign-in");
    expect(res.headers.get("content-security-policy")).toMatch(/frame-ancestors 'none'/);
    const open = proxy(new NextRequest("http://localhost/sign-in"));
    expect(open.headers.get("location")).toBeNull();
  });

  it("API routes: the proxy stays out (it would copy every body) and the config's headers cover them", async () => {
    const rules = await nextConfig.headers!();
    for (const route of apiRoutes) {
      expect(unstable_doesMiddlewareMatch({ config: proxyConfig, url: route }), route).toBe(false);
      const matching = rules.filter((r) => unstable_doesMiddlewareMatch({ config: { matcher: r.source }, url: route }));
      const headers = Object.fromEntries(matching.flatMap((r) => r.headers.map((h) => [h.key, h.value])));
      expect(headers, route).toEqual(securityHeaders(API_CONTENT_SECURITY_POLICY));
    }
  });

  it("the service worker, the one route outside the API, has its own policy from the config", async () => {
    expect(routes.filter((r) => !r.startsWith("/api/"))).toEqual(["/serwist/00000000-0000-4000-8000-000000000001"]);
    const rules = await nextConfig.headers!();
    expect(unstable_doesMiddlewareMatch({ config: proxyConfig, url: "/serwist/sw.js" })).toBe(false);
    const matching = rules.filter((r) =>
      unstable_doesMiddlewareMatch({ config: { matcher: r.source }, url: "/serwist/sw.js" }),
    );
    const headers = Object.fromEntries(matching.flatMap((r) => r.headers.map((h) => [h.key, h.value])));
    expect(headers).toMatchObject(securityHeaders(SERVICE_WORKER_CONTENT_SECURITY_POLICY));
    // The worker fetches and keeps this origin's answers and nothing else.
    expect(SERVICE_WORKER_CONTENT_SECURITY_POLICY).toMatch(/^default-src 'self';/);
    expect(SERVICE_WORKER_CONTENT_SECURITY_POLICY).toMatch(/frame-ancestors 'none'/);
  });
});
