import { expect } from "vitest";
import type { Page } from "playwright-core";
import type { z } from "zod";
import type { contextCreateSchema } from "@/lib/schemas/context";

/** What a test fills in on the new sheet; the trench (C) and the number are the helper's. */
export type FreshSheet = Omit<z.input<typeof contextCreateSchema>, "trenchId" | "number">;

/** Refusals that only say this number is not to be had: in use, held in someone's block, or void. */
const NUMBER_REFUSED = new Set(["duplicate", "number-reserved", "number-void"]);

/**
 * A new context in the demo site's trench C, recorded through the JSON API by whoever is signed in on `page`,
 * under the first number from 3500 up that the server accepts. The browser tests share one demo stack, so a
 * number that looks free in the list may be held in a device's block by an earlier test: such refusals move on
 * to the next number, any other answer fails the test. With `below`, the new context is related below that
 * context (by number), so its sheet has the relation sign-off asks for.
 */
export async function freshContext(page: Page, sheet: FreshSheet, options: { below?: number } = {}) {
  const sites = (await (await page.request.get("/api/sites")).json()) as { id: string; code: string }[];
  const site = sites.find((s) => s.code === "WHD26");
  if (!site) throw new Error("the demo site WHD26 is not among the signed-in user's sites");
  const base = `/api/sites/${site.id}`;
  const trenches = (await (await page.request.get(`${base}/trenches`)).json()) as { id: string; code: string }[];
  const trench = trenches.find((t) => t.code === "C");
  if (!trench) throw new Error("the demo site has no trench C");
  const contexts = (await (await page.request.get(`${base}/contexts`)).json()) as { id: string; number: number }[];
  const taken = new Set(contexts.map((c) => c.number));

  let number = 3500;
  for (let tries = 0; ; tries++) {
    while (taken.has(number)) number++;
    const made = await page.request.post(`${base}/contexts`, { data: { ...sheet, trenchId: trench.id, number } });
    if (made.status() === 201) {
      const contextId = ((await made.json()) as { id: string }).id;
      if (options.below !== undefined) {
        const above = contexts.find((c) => c.number === options.below);
        if (!above) throw new Error(`the demo site has no context ${options.below}`);
        const related = await page.request.post(`${base}/relations`, {
          data: { contextId, reading: "below", otherId: above.id },
        });
        expect(related.status(), await related.text()).toBe(201);
      }
      return { siteId: site.id, contextId, number };
    }
    const body = (await made.json()) as { code?: string };
    if (made.status() !== 409 || !NUMBER_REFUSED.has(body.code ?? "") || tries >= 200) {
      throw new Error(`context ${number} was refused: ${made.status()} ${JSON.stringify(body)}`);
    }
    taken.add(number);
  }
}
