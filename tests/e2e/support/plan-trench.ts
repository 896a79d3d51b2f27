import { expect } from "vitest";
import type { Browser, Page } from "playwright-core";
import { newPage, shown, signIn } from "./browser";

export type PlanView = { scale: number; ox: number; oy: number };

/** Opens a fresh trench (so runs never collide) with a placeholder outline and one open context. */
export async function freshTrench(page: Page) {
  const sites = (await (await page.request.get("/api/sites")).json()) as { id: string; code: string }[];
  const site = sites.find((s) => s.code === "WHD26") ?? sites[0];
  const code = `P${Date.now().toString(36).slice(-5).toUpperCase()}`;
  const t = await page.request.post(`/api/sites/${site.id}/trenches`, {
    data: {
      code,
      name: "Plan test",
      outline: {
        type: "Polygon",
        coordinates: [
          [
            [0, 0],
            [8, 0],
            [4, 6],
            [0, 0],
          ],
        ],
      },
    },
  });
  expect(t.status()).toBe(201);
  const trench = await t.json();
  const number = 60000 + Math.floor(Math.random() * 30000);
  const c = await page.request.post(`/api/sites/${site.id}/contexts`, {
    data: { trenchId: trench.id, number, type: "deposit" },
  });
  expect(c.status()).toBe(201);
  return { siteId: site.id as string, trenchId: trench.id as string, code, contextNumber: number };
}

/** A digger's plan of a fresh trench, open and drawn, in a new page of that size. */
export async function openFreshPlan(browser: Browser, size: "desktop" | "tablet") {
  const page = await newPage(browser, size);
  await signIn(page, "digger");
  const t = await freshTrench(page);
  await page.goto(`/sites/${t.siteId}/trenches/${t.trenchId}`);
  await shown(page.getByTestId("plan-canvas"), 20_000);
  return { page, t };
}

/** The view the plan canvas publishes on its element (data-view). */
export async function planView(page: Page): Promise<PlanView> {
  return JSON.parse((await page.getByTestId("plan-canvas").getAttribute("data-view"))!) as PlanView;
}

/** Screen position (page coordinates) of a grid point, from the view the canvas publishes. */
export async function at(page: Page, x: number, y: number): Promise<[number, number]> {
  const view = await planView(page);
  const box = (await page.getByTestId("plan-canvas").boundingBox())!;
  return [box.x + view.ox + x * view.scale, box.y + view.oy - y * view.scale];
}

/** A tap (touch) or click (mouse) on the plan at grid point (x, y). */
export async function tapPlan(page: Page, touch: boolean, x: number, y: number) {
  await page.evaluate(() => window.scrollTo(0, 0));
  const [sx, sy] = await at(page, x, y);
  if (touch) await page.touchscreen.tap(sx, sy);
  else await page.mouse.click(sx, sy);
}
