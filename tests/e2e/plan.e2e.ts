/**
 * The trench plan as a new digger meets it, at desktop and tablet size: upload a photo through the
 * upload fake, fit it with four control points, draw the trench edge and a hole, place three finds,
 * see them listed with server-allocated numbers, and see an out-of-trench find refused with its distance.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import sharp from "sharp";
import { openBrowser, shown } from "./support/browser";
import { openFreshPlan, tapPlan } from "./support/plan-trench";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** A synthetic vertical photo: brown soil, four white pegs at known pixels. */
const PEGS = [
  { px: 100, py: 100, x: 0, y: 6 },
  { px: 1100, py: 100, x: 8, y: 6 },
  { px: 1100, py: 800, x: 8, y: 0 },
  { px: 100, py: 800, x: 0, y: 0 },
];
async function trenchPhoto(): Promise<Buffer> {
  const dots = PEGS.map(
    (p) => `<circle cx="${p.px}" cy="${p.py}" r="14" fill="#fff" stroke="#000" stroke-width="4"/>`,
  ).join("");
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="900"><rect width="1200" height="900" fill="#7a5a3a"/><rect x="100" y="100" width="1000" height="700" fill="#9b7550"/>${dots}</svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 80 }).toBuffer();
}

for (const size of ["desktop", "tablet"] as const) {
  describe(`trench plan at ${size} size`, () => {
    it("goes from an empty trench to a fitted photo, an outline with a hole and placed finds", async () => {
      const touch = size === "tablet";
      const { page, t } = await openFreshPlan(browser, size);

      // 1. Upload a photo through the uploadthing SDK and the local fake.
      await page.getByRole("tab", { name: "Photo" }).click();
      await page
        .getByTestId("photo-input")
        .setInputFiles({ name: "trench-vertical.jpg", mimeType: "image/jpeg", buffer: await trenchPhoto() });
      await shown(page.getByRole("status").filter({ hasText: "trench-vertical.jpg” uploaded" }), 30_000);

      // 2. Fit it: tap the four pegs on the photo, type their grid positions.
      const img = page.getByTestId("fit-photo");
      await shown(img);
      await page.waitForFunction(
        () => (document.querySelector("[data-testid=fit-photo]") as HTMLImageElement | null)?.naturalWidth === 1200,
      );
      for (const [i, p] of PEGS.entries()) {
        await img.scrollIntoViewIfNeeded();
        const ib = (await img.boundingBox())!;
        const position = { x: (p.px / 1200) * ib.width, y: (p.py / 900) * ib.height };
        if (touch) await img.tap({ position });
        else await img.click({ position });
        await page.getByLabel(`Point ${i + 1} x`).fill(String(p.x));
        await page.getByLabel(`Point ${i + 1} y`).fill(String(p.y));
      }
      await page.getByRole("button", { name: "Fit photo to grid" }).click();
      const summary = page.getByTestId("fit-summary");
      await shown(summary, 20_000);
      expect(await summary.textContent()).toMatch(/projective, 4 points/);
      for (let i = 1; i <= 4; i++)
        expect(await page.getByTestId(`residual-${i}`).textContent()).toMatch(/\d+(\.\d+)? (mm|cm)/);

      // 3. Draw the trench edge, then a hole, and save.
      await page.getByRole("button", { name: /Draw edge/ }).click();
      for (const [x, y] of [
        [0, 0],
        [8, 0],
        [8, 6],
        [0, 6],
        [0, 0],
      ] as const)
        await tapPlan(page, touch, x, y);
      await page.getByRole("button", { name: /Add hole/ }).click();
      for (const [x, y] of [
        [3, 2],
        [5, 2],
        [5, 3],
        [3, 3],
      ] as const)
        await tapPlan(page, touch, x, y);
      await page.getByRole("button", { name: "Close ring" }).click();
      expect(await page.getByTestId("outline-holes").textContent()).toBe("1");
      expect(await page.getByTestId("outline-area").textContent()).toBe("46.00 m²"); // 8 × 6 less the 2 × 1 hole
      await page.getByRole("button", { name: "Save outline" }).click();
      await shown(page.getByTestId("plan-message").filter({ hasText: "Outline saved" }));

      // 4. Place three finds; each gets its number from the server.
      await page.getByRole("button", { name: /Place find/ }).click();
      const recorded: number[] = [];
      for (const [x, y] of [
        [1, 1],
        [2, 4.5],
        [6.5, 5],
      ] as const) {
        await tapPlan(page, touch, x, y);
        await page.getByLabel("Class").selectOption({ index: 1 });
        await page.getByLabel("Context").selectOption({ label: `${t.contextNumber} · deposit` });
        await page.getByRole("button", { name: "Record find", exact: true }).click();
        const msg = page.getByTestId("plan-message").filter({ hasText: /Find #\d+ recorded/ });
        await shown(msg);
        recorded.push(Number(/#(\d+)/.exec((await msg.textContent())!)![1]));
        await page.getByRole("button", { name: "Dismiss message" }).click();
        await page.getByRole("button", { name: /Place find/ }).click();
      }
      const api = (await (await page.request.get(`/api/sites/${t.siteId}/finds?trenchId=${t.trenchId}`)).json()) as {
        rows: { number: number; x: number; y: number }[];
      };
      expect(api.rows.map((r) => r.number).sort()).toEqual([...recorded].sort());
      await page.getByRole("tab", { name: "Finds" }).click();
      for (const n of recorded) await shown(page.getByRole("button", { name: new RegExp(`#${n}\\b`) }));

      // 5. A find tapped outside the outline is refused at the tap, with the distance, before any form opens.
      await page.getByRole("button", { name: /Place find/ }).click();
      await tapPlan(page, touch, 8.3, 3);
      const refusal = page.getByRole("alert").filter({ hasText: "outside its trench" });
      await shown(refusal);
      expect(await refusal.textContent()).toMatch(/0\.3\d\d m outside the outline of trench/);
      expect(await page.getByRole("button", { name: "Record find", exact: true }).count()).toBe(0);
      const after = (await (await page.request.get(`/api/sites/${t.siteId}/finds?trenchId=${t.trenchId}`)).json()) as {
        total: number;
      };
      expect(after.total).toBe(3);
      await page.screenshot({ path: `test-results/plan-${size}.png` });
      await page.context().close();
    });
  });
}
