import sharp from "sharp";
import { fitPhoto, type ControlPoint } from "@/lib/geometry/photo-fit";
import type { StoredFit } from "@/lib/geometry/photo-fit-input";
import { type Ring, createRandom } from "@/lib/spatial";

/**
 * A synthetic vertical photo of a trench for the demo (invented imagery, for the demo only): soil drawn
 * with noise, the cut edge and baulk, scattered stones and four survey pegs. It is drawn through a known
 * grid → pixel similarity (slightly rotated, as a real mast photo is), so the demo's fit is a real fit of
 * the pegs' pixels and its residuals are the rounding of those pixels.
 */
const WIDTH = 1500;
const HEIGHT = 1100;
const SCALE = 95; // pixels per metre
const ANGLE = (3.5 * Math.PI) / 180;

/** grid (x, y) → photo pixel (px, py); y grows north on the grid and down in the photo. */
function toPixel(x: number, y: number): [number, number] {
  const c = Math.cos(ANGLE),
    s = Math.sin(ANGLE);
  return [110 + SCALE * (c * (x + 0.8) - s * (y + 0.8)), HEIGHT - 90 - SCALE * (s * (x + 0.8) + c * (y + 0.8))];
}

const path = (ring: Ring) =>
  "M" +
  ring
    .map(([x, y]) =>
      toPixel(x, y)
        .map((v) => v.toFixed(1))
        .join(","),
    )
    .join("L") +
  "Z";

export type DemoPhoto = { jpeg: Buffer; fit: StoredFit; fileName: string };

export async function demoTrenchPhoto(
  outer: Ring,
  holes: Ring[],
  pegs: [number, number][],
  seed: number,
  fittedBy: string,
): Promise<DemoPhoto> {
  const rng = createRandom(seed, 7);
  const stones = Array.from({ length: 140 }, () => {
    const [px, py] = [rng.next() * WIDTH, rng.next() * HEIGHT];
    const r = 3 + rng.next() * 9;
    const tone = 150 + Math.floor(rng.next() * 70);
    return `<ellipse cx="${px.toFixed(1)}" cy="${py.toFixed(1)}" rx="${r.toFixed(1)}" ry="${(r * (0.6 + 0.4 * rng.next())).toFixed(1)}" fill="rgb(${tone},${tone - 12},${tone - 30})" opacity="0.85"/>`;
  }).join("");
  const pegMarks = pegs
    .map(([x, y]) => {
      const [px, py] = toPixel(x, y);
      return `<circle cx="${px}" cy="${py}" r="9" fill="#f4f1ea" stroke="#b3261e" stroke-width="4"/><circle cx="${px}" cy="${py}" r="2" fill="#b3261e"/>`;
    })
    .join("");
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${HEIGHT}">
    <defs><filter id="soil"><feTurbulence type="fractalNoise" baseFrequency="0.035" numOctaves="4" seed="${seed % 1000}"/><feColorMatrix type="matrix" values="0 0 0 0 0.45  0 0 0 0 0.33  0 0 0 0 0.22  0 0 0 0.55 0"/></filter></defs>
    <rect width="100%" height="100%" fill="#8a6f4e"/>
    <rect width="100%" height="100%" filter="url(#soil)"/>
    <path d="${path(outer)}" fill="#5e4631" fill-opacity="0.8" stroke="#2e2116" stroke-width="5"/>
    ${holes.map((h) => `<path d="${path(h)}" fill="#9c8060" stroke="#2e2116" stroke-width="4"/>`).join("")}
    ${stones}
    ${pegMarks}
  </svg>`;
  const jpeg = await sharp(Buffer.from(svg)).jpeg({ quality: 82 }).toBuffer();
  // The pegs as a digger would click them: whole pixels.
  const points: ControlPoint[] = pegs.map(([x, y]) => {
    const [px, py] = toPixel(x, y);
    return { px: Math.round(px), py: Math.round(py), x, y };
  });
  const fit = fitPhoto(points, { model: "similarity" });
  return {
    jpeg,
    fileName: "trench-A-mast-photo.jpg",
    fit: { ...fit, points, fittedAt: new Date(Date.UTC(2026, 5, 8, 7, 30)).toISOString(), fittedBy },
  };
}
