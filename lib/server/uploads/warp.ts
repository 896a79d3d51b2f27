import "server-only";
import sharp from "sharp";
import { applyFit, invertFit, mat3 } from "@/lib/geometry/photo-fit";
import { boundsOf } from "@/lib/geometry/plan-view";
import { badInput } from "../errors";

/** Longest side of the warped raster. */
const WARP_PX = 2048;

export type Warp = {
  png: Buffer;
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
  width: number;
  height: number;
};

/**
 * Resamples the display photo through a projective fit into a north-up raster on the site grid, so the
 * plan can draw it as a plain image at its grid bounds. sharp decodes and encodes; the per-pixel inverse
 * mapping with bilinear interpolation is done here because sharp's own `affine` cannot express a homography.
 */
export async function warpProjective(display: Buffer, matrix: number[]): Promise<Warp> {
  const { data, info } = await sharp(display).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  const { width: w, height: h } = info;
  const corners: [number, number][] = [
    [0, 0],
    [w, 0],
    [w, h],
    [0, h],
  ];
  const [, , , , , , wx, wy, w0] = mat3(matrix);
  const denominators = corners.map(([px, py]) => wx * px + wy * py + w0);
  if (!denominators.every((d) => d > 0) && !denominators.every((d) => d < 0)) {
    throw badInput("This projective fit folds the photo through its horizon; check the control points.", {
      points: ["The fit folds the photo."],
    });
  }
  const grid = corners.map(([px, py]) => applyFit(matrix, px, py));
  const { minX, maxX, minY, maxY } = boundsOf(grid);
  const ppm = Math.min(
    Math.sqrt((w * h) / ((maxX - minX) * (maxY - minY))),
    WARP_PX / Math.max(maxX - minX, maxY - minY),
  );
  const outW = Math.max(1, Math.round((maxX - minX) * ppm));
  const outH = Math.max(1, Math.round((maxY - minY) * ppm));
  const inv = invertFit(matrix);
  const out = Buffer.alloc(outW * outH * 4);
  // The corners below are clamped into the photo, so a missing byte means the decoder's raster is short.
  const channel = (at: number): number => {
    const v = data[at];
    if (v === undefined) throw new Error(`The decoded photo has no byte ${at} (${w} × ${h} px, 4 channels).`);
    return v;
  };
  for (let j = 0; j < outH; j++) {
    const y = maxY - ((j + 0.5) / outH) * (maxY - minY);
    for (let i = 0; i < outW; i++) {
      const x = minX + ((i + 0.5) / outW) * (maxX - minX);
      const [fx, fy] = applyFit(inv, x, y);
      const sx = fx - 0.5;
      const sy = fy - 0.5;
      if (sx < 0 || sy < 0 || sx > w - 1 || sy > h - 1) continue;
      const x0 = Math.floor(sx);
      const y0 = Math.floor(sy);
      const x1 = Math.min(x0 + 1, w - 1);
      const y1 = Math.min(y0 + 1, h - 1);
      const ax = sx - x0;
      const ay = sy - y0;
      const o = 4 * (j * outW + i);
      for (let ch = 0; ch < 4; ch++) {
        const top = channel(4 * (y0 * w + x0) + ch) * (1 - ax) + channel(4 * (y0 * w + x1) + ch) * ax;
        const bottom = channel(4 * (y1 * w + x0) + ch) * (1 - ax) + channel(4 * (y1 * w + x1) + ch) * ax;
        out[o + ch] = Math.round(top * (1 - ay) + bottom * ay);
      }
    }
  }
  const png = await sharp(out, { raw: { width: outW, height: outH, channels: 4 } })
    .png({ compressionLevel: 6 })
    .toBuffer();
  return { png, minX, minY, maxX, maxY, width: outW, height: outH };
}
