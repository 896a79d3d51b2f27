import type { View } from "@/lib/geometry/plan-view";

/** The part of the screen (CSS pixels, viewport coordinates) a painter must cover. */
export type Area = { x0: number; y0: number; x1: number; y1: number };
export type Painter = (c: CanvasRenderingContext2D, v: View, area: Area) => void;
export type CacheOutcome = "blit" | "built" | "direct";

/** The device pixel ratio a canvas context draws at (its transform's x scale, rounded to 1/100, never below 1). */
export function pixelRatioOf(c: CanvasRenderingContext2D): number {
  return Math.max(1, Math.round(c.getTransform().a * 100) / 100);
}

const isWhole = (n: number) => Math.abs(n - Math.round(n)) < 1e-6;
const sameKey = (a: readonly unknown[], b: readonly unknown[]) =>
  a.length === b.length && a.every((x, i) => Object.is(x, b[i]));

/**
 * One plan layer (the finds, the photo) painted once into an offscreen bitmap a margin larger than the
 * viewport, then copied with an offset while the plan pans. A copy at a whole-pixel offset is the same
 * picture pixel for pixel, so it is used whenever the view is idle too; a fractional offset is used only
 * while a gesture is live and the layer is repainted exactly once the gesture ends. A scale change that
 * is still going on (wheel, pinch, zoom keys) paints straight to the screen; the bitmap is rebuilt at the
 * first steady frame or `settleMs` after the last such frame.
 */
export class ViewCache {
  private canvas: HTMLCanvasElement | null = null;
  private key: readonly unknown[] = [];
  private at: View | null = null;
  private marginDev = 0;
  private lastScale = NaN;
  private settle: ReturnType<typeof setTimeout> | null = null;

  constructor(
    private readonly onSettle: () => void,
    private readonly settleMs = 180,
  ) {}

  /**
   * Paints the layer into `c` (whose transform is the device pixel ratio) for view `v` over a `w` × `h`
   * viewport. `key` lists everything the picture depends on besides the view.
   */
  draw(
    c: CanvasRenderingContext2D,
    v: View,
    w: number,
    h: number,
    key: readonly unknown[],
    live: boolean,
    paint: Painter,
  ): CacheOutcome {
    const dpr = pixelRatioOf(c);
    const fullKey = [...key, v.scale, dpr];
    const steady = v.scale === this.lastScale;
    this.lastScale = v.scale;
    if (this.canvas && this.at && sameKey(this.key, fullKey)) {
      const dx = (v.ox - this.at.ox) * dpr - this.marginDev;
      const dy = (v.oy - this.at.oy) * dpr - this.marginDev;
      const covers = dx <= 0 && dy <= 0 && dx + this.canvas.width >= w * dpr && dy + this.canvas.height >= h * dpr;
      if (covers && (live || (isWhole(dx) && isWhole(dy)))) {
        this.blit(c, dx, dy);
        return "blit";
      }
    }
    if (!steady) {
      paint(c, v, { x0: 0, y0: 0, x1: w, y1: h });
      if (this.settle) clearTimeout(this.settle);
      this.settle = setTimeout(() => {
        this.settle = null;
        this.onSettle();
      }, this.settleMs);
      return "direct";
    }
    this.build(v, w, h, dpr, fullKey, paint);
    this.blit(c, -this.marginDev, -this.marginDev);
    return "built";
  }

  dispose() {
    if (this.settle) clearTimeout(this.settle);
    this.settle = null;
    this.canvas = null;
  }

  private build(v: View, w: number, h: number, dpr: number, key: readonly unknown[], paint: Painter) {
    // A third of the larger side each way covers an ordinary drag; a longer one rebuilds as it goes.
    this.marginDev = Math.round(Math.min(360, Math.max(w, h) / 3) * dpr);
    const canvas = (this.canvas ??= document.createElement("canvas"));
    const cw = Math.ceil(w * dpr) + 2 * this.marginDev;
    const ch = Math.ceil(h * dpr) + 2 * this.marginDev;
    if (canvas.width !== cw || canvas.height !== ch) [canvas.width, canvas.height] = [cw, ch];
    const cc = canvas.getContext("2d")!;
    cc.setTransform(1, 0, 0, 1, 0, 0);
    cc.clearRect(0, 0, cw, ch);
    cc.setTransform(dpr, 0, 0, dpr, this.marginDev, this.marginDev);
    const m = this.marginDev / dpr;
    paint(cc, v, { x0: -m, y0: -m, x1: w + m, y1: h + m });
    this.key = key;
    this.at = v;
  }

  private blit(c: CanvasRenderingContext2D, dx: number, dy: number) {
    c.save();
    c.setTransform(1, 0, 0, 1, 0, 0);
    c.imageSmoothingEnabled = false;
    c.drawImage(this.canvas!, Math.round(dx), Math.round(dy));
    c.restore();
  }
}
