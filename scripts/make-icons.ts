/**
 * Renders Loamwork's app icons (public/icons/*.png) from its own drawing, public/icons/loamwork.svg.
 * Run `npx tsx scripts/make-icons.ts` after changing the drawing; the PNGs are committed.
 * "maskable" icons keep the mark inside the safe zone (the inner 80 %) on a full paper square.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import sharp from "sharp";

const dir = path.resolve(import.meta.dirname, "../public/icons");
const svg = readFileSync(path.join(dir, "loamwork.svg"));

async function main() {
  for (const size of [192, 512]) {
    await sharp(svg, { density: 300 })
      .resize(size, size)
      .png()
      .toFile(path.join(dir, `icon-${size}.png`));
    const inner = Math.round(size * 0.8);
    const mark = await sharp(svg, { density: 300 }).resize(inner, inner).png().toBuffer();
    await sharp({ create: { width: size, height: size, channels: 4, background: "#f7f2e8" } })
      .composite([{ input: mark, gravity: "centre" }])
      .png()
      .toFile(path.join(dir, `maskable-${size}.png`));
  }
  await sharp(svg, { density: 300 })
    .resize(180, 180)
    .flatten({ background: "#f7f2e8" })
    .png()
    .toFile(path.join(dir, "apple-touch-icon.png"));
}

void main();
