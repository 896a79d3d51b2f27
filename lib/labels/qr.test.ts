import jsQR from "jsqr";
import { describe, expect, it } from "vitest";
import { qrPath } from "./qr";

/** Paints the path's unit squares into RGBA pixels, `scale` pixels a module, white elsewhere. */
function raster(size: number, d: string, scale = 4): { data: Uint8ClampedArray; width: number } {
  const width = size * scale;
  const data = new Uint8ClampedArray(width * width * 4).fill(255);
  for (const m of d.matchAll(/M(\d+) (\d+)h1v1h-1z/g)) {
    const mx = Number(m[1]);
    const my = Number(m[2]);
    for (let y = my * scale; y < (my + 1) * scale; y++)
      for (let x = mx * scale; x < (mx + 1) * scale; x++) data.fill(0, (y * width + x) * 4, (y * width + x) * 4 + 3);
  }
  return { data, width };
}

describe("label QR codes", () => {
  it("a separate decoder (jsqr) reads back the text the path was drawn from", () => {
    for (const text of ["LW/WHD26/F/1", "https://loamwork.example.org/l/WHD26/S/99999999"]) {
      const { size, d } = qrPath(text);
      const { data, width } = raster(size, d);
      expect(jsQR(data, width, width)?.data).toBe(text);
    }
  });
});
