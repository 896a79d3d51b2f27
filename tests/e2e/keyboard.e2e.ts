import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { newPage, openBrowser, shown, signIn } from "./support/browser";
import { freshContext } from "./support/fresh-context";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/**
 * Presses Tab until the focused element is the one described (its accessible text or label), as a keyboard user would.
 */
async function tabTo(page: Page, what: string | RegExp, max = 150): Promise<void> {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press("Tab");
    const here = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el) return "";
      const label = el.id ? document.querySelector(`label[for="${CSS.escape(el.id)}"]`)?.textContent : null;
      return [el.getAttribute("aria-label"), label, el.innerText].filter(Boolean).join(" | ");
    });
    if (typeof what === "string" ? here.split(" | ").some((t) => t.trim() === what) : what.test(here)) return;
  }
  throw new Error(`Tab never reached ${String(what)} within ${max} presses`);
}

const focused = (page: Page) => page.evaluate(() => (document.activeElement as HTMLElement | null)?.innerText ?? "");

describe("keyboard only", () => {
  it("the register: a find opens and closes from the keyboard", async () => {
    const page = await newPage(browser);
    await signIn(page, "specialist");
    const [site] = await (await page.request.get("/api/sites")).json();
    await page.goto(`/sites/${site.id}/finds`);
    const first = await page
      .getByRole("table", { name: "Finds register" })
      .locator("tbody tr button[aria-expanded]")
      .first()
      .innerText();
    await tabTo(page, first);
    await page.keyboard.press("Enter");
    await shown(page.getByRole("heading", { name: `Find ${first}` }));
    await tabTo(page, "Close");
    await page.keyboard.press("Enter");
    await page.getByRole("heading", { name: `Find ${first}` }).waitFor({ state: "detached" });
    await page.context().close();
  });

  it("the sheet and the sign-off queue: a digger fills in and submits, the director signs off, without a pointer", async () => {
    const d = await newPage(browser);
    await signIn(d, "digger");
    const { siteId, contextId, number } = await freshContext(
      d,
      {
        type: "layer",
        compaction: "firm",
        composition: "silty sand",
        description: "A layer.",
        interpretation: "Subsoil.",
      },
      { below: 3001 },
    );

    // The sheet: the missing colour is typed and saved from the keyboard.
    await d.goto(`/sites/${siteId}/contexts/${contextId}`);
    await tabTo(d, "Colour");
    await d.keyboard.type("mid brown");
    await tabTo(d, "Save the sheet");
    await d.keyboard.press("Enter");
    await shown(d.getByRole("button", { name: `Submit ${number} for sign-off`, disabled: false }));

    // The queue: submitted from the keyboard.
    await d.goto(`/sites/${siteId}/sign-off`);
    await tabTo(d, `Submit ${number} for sign-off`);
    await d.keyboard.press("Enter");
    await shown(d.locator(`tr[data-context="${number}"]`).getByText("awaiting sign-off"));

    const boss = await newPage(browser);
    await signIn(boss, "director");
    await boss.goto(`/sites/${siteId}/sign-off`);
    await tabTo(boss, `Sign off ${number}`);
    await boss.keyboard.press("Enter");
    await shown(boss.getByRole("alertdialog"));
    expect(await focused(boss)).toBe(`Lock context ${number}`);
    await boss.keyboard.press("Enter");
    await shown(boss.locator(`tr[data-context="${number}"]`).getByText("signed off"));
    await d.context().close();
    await boss.context().close();
  });
});
