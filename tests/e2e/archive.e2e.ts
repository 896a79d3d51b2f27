import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import { unzipSync } from "fflate";
import jsQR from "jsqr";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { parseLabelCode, labelPath } from "@/lib/labels/code";
import { newPage, openBrowser, openDemoSite, shown, signIn } from "./support/browser";
import { freshContext } from "./support/fresh-context";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** The QR codes in a PNG, read by jsqr from its pixels (what a phone's camera would see on paper). */
async function decodeQr(png: Buffer): Promise<string | null> {
  const { data, info } = await sharp(png).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  return (
    jsQR(new Uint8ClampedArray(data.buffer, data.byteOffset, data.byteLength), info.width, info.height)?.data ?? null
  );
}

describe("the site archive: samples and labels", () => {
  it("a digger records a sample, prints its label, and the code read from the printed sheet opens the sample", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    const site = await openDemoSite(page);
    await page.goto(`${site}/samples/new`);
    await page.getByLabel("Kind of sample").selectOption("charcoal");
    await page.getByLabel("Volume (litres)").fill("0");
    await page.getByRole("button", { name: "Record the sample" }).click();
    // The schema the server uses refuses it in the browser, next to the field.
    await shown(page.getByText("A volume is more than 0 litres."));
    await page.getByLabel("Volume (litres)").fill("2.5");
    await page.getByLabel("Purpose").fill("Charcoal from the hearth, for a radiocarbon date");
    await page.getByRole("button", { name: "Record the sample" }).click();
    await page.waitForURL(/\/samples\/[0-9a-f-]{36}$/);
    const heading = await page.getByRole("heading", { level: 1 }).textContent();
    const number = Number(/Sample\s*(\d+)/.exec(heading ?? "")?.[1]);
    expect(number).toBeGreaterThan(0);
    const samplePath = new URL(page.url()).pathname;

    await page.goto(`${site}/labels?kind=samples&fromNumber=${number}&toNumber=${number}&preset=14`);
    const label = page.locator(".label-cell").first();
    await shown(label);
    await expect(label.textContent()).resolves.toContain(`S${number}`);
    // The printed look: print media, then the label as it renders, read back by a QR decoder.
    await page.emulateMedia({ media: "print" });
    const png = await label.screenshot({ scale: "device" });
    const text = await decodeQr(png);
    const ref = parseLabelCode(text ?? "");
    expect(ref, `decoded: ${text}`).toMatchObject({ kind: "S", number });
    await page.emulateMedia({ media: "screen" });

    await page.goto(labelPath(ref!));
    await page.waitForURL(`**${samplePath}`);
    await shown(page.getByRole("heading", { level: 1, name: `Sample ${number}` }));

    // The scan action takes a photo of the label when no camera is at hand, and opens the sample too.
    await page.goto("/scan");
    await page
      .getByLabel("Or a photo of the label")
      .setInputFiles({ name: "label.png", mimeType: "image/png", buffer: png });
    await page.waitForURL(`**${samplePath}`);
    await page.context().close();
  });

  it("attaches a photo to a context", async () => {
    const page = await newPage(browser);
    await signIn(page, "digger");
    // A fresh open context, so the sheet takes new photos whatever other tests did to the demo's contexts.
    const { siteId, contextId, number } = await freshContext(page, { type: "fill" });
    await page.goto(`/sites/${siteId}/contexts/${contextId}`);
    const panel = page.getByRole("region", { name: `Photos of context ${number}` });
    await shown(panel.getByText(`No photos of context ${number} yet.`));
    const photo = await sharp({ create: { width: 800, height: 600, channels: 3, background: "#8a6a4a" } })
      .jpeg()
      .withExif({ IFD2: { DateTimeOriginal: "2026:07:14 09:30:00", OffsetTimeOriginal: "+00:00" } })
      .toBuffer();
    await panel
      .getByLabel("Photo", { exact: true })
      .setInputFiles({ name: "fill.jpg", mimeType: "image/jpeg", buffer: photo });
    await panel.getByLabel("Facing").selectOption("NE");
    await panel.getByLabel("Scale shown").fill("1 m");
    await panel.getByLabel("Caption").fill(`Fill ${number} before excavation`);
    await panel.getByRole("button", { name: "Add the photo" }).click();
    await shown(panel.getByRole("status").filter({ hasText: /Photo \d+ added to context/ }), 30_000);
    const thumb = panel.locator(`img[alt*="Fill ${number} before excavation"]`);
    await shown(thumb);
    // The thumbnail really loads (the member-only file route answered with an image).
    await page.waitForFunction((alt) => {
      const img = [...document.querySelectorAll("img")].find((i) => i.alt.includes(alt));
      return Boolean(img && img.complete && img.naturalWidth > 0);
    }, `Fill ${number} before excavation`);
    await expect(panel.getByText(/facing NE · scale 1 m/).count()).resolves.toBe(1);
    await shown(panel.getByText(/14 Jul 2026, 09:30 UTC/));
    // Opening it shows the display copy on the page, full size.
    await panel.getByRole("button", { name: /^Open photo \d+$/ }).click();
    const viewer = page.getByRole("dialog", { name: /^Photo \d+$/ });
    await shown(viewer);
    await page.waitForFunction(() => {
      const img = [...document.querySelectorAll("img")].find((i) => i.alt.endsWith("display copy"));
      return img?.complete === true && img.naturalWidth === 800;
    });
    await viewer.getByRole("button", { name: "Close" }).click();
    await expect(viewer.count()).resolves.toBe(0);
    await page.context().close();
  });
});

describe("the deposition package", () => {
  it("exports a package", async () => {
    const page = await newPage(browser);
    await signIn(page, "director");
    const site = await openDemoSite(page);
    await page.goto(`${site}/sign-off`);
    const panel = page.getByRole("region", { name: "Deposition package" });
    await panel.getByLabel("Package of").selectOption({ label: "the whole site" });
    await panel.getByRole("button", { name: "Write the package" }).click();

    // The job's row appears at once, queued, and is followed until it is written.
    const job = panel.getByRole("list", { name: "Packages written" }).locator("li").first();
    await shown(job.getByText(/Waiting to start…|files written/));
    // Written in a few seconds on a quiet machine; a busy one (the suite beside other builds) took over a
    // minute, so the wait is long, and a package that failed says why rather than timing out.
    await shown(panel.locator('li[data-status="done"], li[data-status="failed"]'), 180_000);
    if ((await job.getAttribute("data-status")) === "failed") throw new Error(await job.innerText());
    const fingerprint = (await job.locator("[data-fingerprint]").textContent())?.trim() ?? "";
    expect(fingerprint).toMatch(/^[0-9a-f]{64}$/);

    const [download] = await Promise.all([
      page.waitForEvent("download"),
      job.getByRole("link", { name: /^Download / }).click(),
    ]);
    const zip = unzipSync(new Uint8Array(await readFile((await download.path())!)));
    const root = Object.keys(zip)[0]!.split("/")[0];
    expect(download.suggestedFilename()).toBe(`${root}.zip`);
    expect(new TextDecoder().decode(zip[`${root}/bagit.txt`])).toBe(
      "BagIt-Version: 1.0\nTag-File-Character-Encoding: UTF-8\n",
    );
    const manifest = zip[`${root}/manifest-sha256.txt`]!;
    expect(createHash("sha256").update(manifest).digest("hex")).toBe(fingerprint);
    expect(new TextDecoder().decode(zip[`${root}/bag-info.txt`])).toContain(
      `Package-Fingerprint: sha256:${fingerprint}`,
    );
    expect(Object.keys(zip)).toContain(`${root}/data/records/trench-A.pdf`);
    await page.context().close();
  }, 300_000);
});
