/**
 * Two fingers on the trench plan at tablet size: spreading them zooms in about the point between them,
 * pinching them zooms out, and moving them together carries the plan along. Real touch input through the
 * browser (CDP Input.dispatchTouchEvent), read back from the view the canvas publishes (data-view).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, CDPSession, Page } from "playwright-core";
import { openBrowser } from "./support/browser";
import { openFreshPlan, planView, type PlanView } from "./support/plan-trench";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

type Pt = [number, number];
const lerp = (a: Pt, b: Pt, t: number): Pt => [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t];
const toWorld = (v: PlanView, sx: number, sy: number): Pt => [(sx - v.ox) / v.scale, (v.oy - sy) / v.scale];

/** Puts two fingers down at `from`, slides them to `to` in steps, lifts them. */
async function twoFingers(cdp: CDPSession, from: [Pt, Pt], to: [Pt, Pt], steps = 12) {
  const points = (t: number) =>
    [0, 1].map((id) => {
      const [x, y] = lerp(from[id], to[id], t);
      return { x, y, id, radiusX: 4, radiusY: 4, force: 1 };
    });
  await cdp.send("Input.dispatchTouchEvent", { type: "touchStart", touchPoints: points(0) });
  for (let i = 1; i <= steps; i++)
    await cdp.send("Input.dispatchTouchEvent", { type: "touchMove", touchPoints: points(i / steps) });
  await cdp.send("Input.dispatchTouchEvent", { type: "touchEnd", touchPoints: [] });
}

/** Waits for the published view to differ from `before`, and returns it. */
async function viewAfter(page: Page, before: PlanView): Promise<PlanView> {
  await page.waitForFunction(
    (b) => document.querySelector("[data-testid=plan-canvas]")?.getAttribute("data-view") !== b,
    JSON.stringify(before),
  );
  return planView(page);
}

describe("trench plan, two-finger gestures on a tablet", () => {
  it("pinches to zoom about the point between the fingers and pans with them", async () => {
    const { page } = await openFreshPlan(browser, "tablet");
    await page.evaluate(() => window.scrollTo(0, 0));
    const cdp = await page.context().newCDPSession(page);
    const box = (await page.getByTestId("plan-canvas").boundingBox())!;
    const local = (p: Pt): Pt => [p[0] - box.x, p[1] - box.y];
    const scaleBar = page.getByTestId("scale-bar");

    // Spread from 80 px apart to 240 px apart about a point left of the centre: three times the scale,
    // and the grid point between the fingers stays between them.
    const v0 = await planView(page);
    const bar0 = await scaleBar.textContent();
    const c1: Pt = [box.x + box.width * 0.4, box.y + box.height * 0.55];
    const under1 = toWorld(v0, ...local(c1));
    await twoFingers(
      cdp,
      [
        [c1[0] - 40, c1[1]],
        [c1[0] + 40, c1[1]],
      ],
      [
        [c1[0] - 120, c1[1]],
        [c1[0] + 120, c1[1]],
      ],
    );
    const v1 = await viewAfter(page, v0);
    expect(v1.scale / v0.scale).toBeCloseTo(3, 3);
    const still1 = toWorld(v1, ...local(c1));
    expect(Math.hypot(still1[0] - under1[0], still1[1] - under1[1]) * v1.scale).toBeLessThan(0.5); // under half a pixel
    await page.waitForFunction((b) => document.querySelector("[data-testid=scale-bar]")?.textContent !== b, bar0);

    // Pinch from 240 px to 60 px apart (a quarter) on a slant about another point.
    const c2: Pt = [box.x + box.width * 0.6, box.y + box.height * 0.4];
    const under2 = toWorld(v1, ...local(c2));
    await twoFingers(
      cdp,
      [
        [c2[0] - 96, c2[1] - 72],
        [c2[0] + 96, c2[1] + 72],
      ],
      [
        [c2[0] - 24, c2[1] - 18],
        [c2[0] + 24, c2[1] + 18],
      ],
    );
    const v2 = await viewAfter(page, v1);
    expect(v2.scale / v1.scale).toBeCloseTo(0.25, 3);
    const still2 = toWorld(v2, ...local(c2));
    expect(Math.hypot(still2[0] - under2[0], still2[1] - under2[1]) * v2.scale).toBeLessThan(0.5);

    // Both fingers slide 90 px right and 50 px down, as far apart at the end as at the start: the scale
    // holds and the grid point that was between them at the start is between them at the end.
    const a: Pt = [box.x + box.width * 0.45, box.y + box.height * 0.5];
    const b: Pt = [a[0] + 90, a[1] + 50];
    const grabbed = toWorld(v2, ...local(a));
    await twoFingers(
      cdp,
      [
        [a[0] - 50, a[1]],
        [a[0] + 50, a[1]],
      ],
      [
        [b[0] - 50, b[1]],
        [b[0] + 50, b[1]],
      ],
    );
    const v3 = await viewAfter(page, v2);
    expect(v3.scale / v2.scale).toBeCloseTo(1, 6);
    const carried = toWorld(v3, ...local(b));
    expect(Math.hypot(carried[0] - grabbed[0], carried[1] - grabbed[1]) * v3.scale).toBeLessThan(0.5);
    expect(v3.ox - v2.ox).toBeCloseTo(90, 3);
    expect(v3.oy - v2.oy).toBeCloseTo(50, 3);

    await page.context().close();
  });
});
