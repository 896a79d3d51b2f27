/** The plan's live view store and the bitmap cache that makes a pan a copy instead of 5,000 sprite draws. */
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { ViewCache, type Area } from "@/components/plan/view-cache";
import { createViewStore } from "@/components/plan/view-store";
import type { View } from "@/lib/geometry/plan-view";

type Call = { op: string; args: number[] };

/** Just enough of a 2D context to see what the cache asks of it. */
function fakeContext(dpr: number) {
  const calls: Call[] = [];
  let t = [dpr, 0, 0, dpr, 0, 0];
  const saved: number[][] = [];
  const ctx = {
    calls,
    imageSmoothingEnabled: true,
    getTransform: () => ({ a: t[0] }),
    setTransform: (...m: number[]) => void (t = m),
    save: () => void saved.push(t),
    restore: () => void (t = saved.pop() ?? t),
    clearRect: () => undefined,
    drawImage: (_img: unknown, ...args: number[]) => void calls.push({ op: "drawImage", args }),
  };
  return ctx as typeof ctx & CanvasRenderingContext2D;
}

beforeEach(() => {
  vi.useFakeTimers();
  vi.stubGlobal("document", {
    createElement: () => {
      const canvas = { width: 0, height: 0, ctx: fakeContext(1), getContext: () => canvas.ctx };
      return canvas;
    },
  });
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

const W = 900;
const H = 600;
// The margin is a third of the larger side: 300 px each way.
const M = 300;

function setup(dpr = 1) {
  const settled = vi.fn();
  const cache = new ViewCache(settled, 100);
  const screen = fakeContext(dpr);
  const painted: { v: View; area: Area }[] = [];
  const paint = (_c: CanvasRenderingContext2D, v: View, area: Area) => void painted.push({ v, area });
  const draw = (v: View, live = false, key: unknown[] = ["finds"]) => cache.draw(screen, v, W, H, key, live, paint);
  return { cache, screen, painted, settled, draw };
}

const v0: View = { scale: 20, ox: 100, oy: 500 };

describe("ViewCache", () => {
  it("paints a new scale straight to the screen and asks for a redraw once the scale has settled", () => {
    const { draw, painted, settled, screen } = setup();
    expect(draw(v0)).toBe("direct");
    expect(painted).toEqual([{ v: v0, area: { x0: 0, y0: 0, x1: W, y1: H } }]);
    expect(screen.calls).toEqual([]);
    vi.advanceTimersByTime(99);
    expect(settled).not.toHaveBeenCalled();
    vi.advanceTimersByTime(1);
    expect(settled).toHaveBeenCalledTimes(1);
  });

  it("at a steady scale paints once into a bitmap a margin larger than the view and copies it in place", () => {
    const { draw, painted, screen } = setup();
    draw(v0);
    expect(draw(v0)).toBe("built");
    expect(painted[1].area).toEqual({ x0: -M, y0: -M, x1: W + M, y1: H + M });
    expect(screen.calls.at(-1)).toEqual({ op: "drawImage", args: [-M, -M] });
  });

  it("a whole-pixel pan is a copy at the new offset, idle or live, with no repaint", () => {
    const { draw, painted, screen } = setup();
    draw(v0);
    draw(v0);
    expect(draw({ ...v0, ox: v0.ox + 37, oy: v0.oy - 12 })).toBe("blit");
    expect(screen.calls.at(-1)).toEqual({ op: "drawImage", args: [-M + 37, -M - 12] });
    expect(draw({ ...v0, ox: v0.ox - 250 }, true)).toBe("blit");
    expect(painted).toHaveLength(2);
  });

  it("a fractional offset is copied rounded only while the gesture is live; idle, the layer is repainted exactly", () => {
    const { draw, painted, screen } = setup();
    draw(v0);
    draw(v0);
    const v = { ...v0, ox: v0.ox + 10.4 };
    expect(draw(v, true)).toBe("blit");
    expect(screen.calls.at(-1)).toEqual({ op: "drawImage", args: [-M + 10, -M] });
    expect(draw(v, false)).toBe("built");
    expect(painted.at(-1)!.v).toEqual(v);
  });

  it("repaints when the pan leaves the margin, when the picture changes, and paints directly while the scale changes", () => {
    const { draw, painted } = setup();
    draw(v0);
    draw(v0);
    expect(draw({ ...v0, ox: v0.ox + M + 1 }, true)).toBe("built");
    expect(draw({ ...v0, ox: v0.ox + M + 1 }, true, ["other finds"])).toBe("built");
    expect(draw({ ...v0, scale: 21 }, true)).toBe("direct");
    expect(draw({ ...v0, scale: 22 }, true)).toBe("direct");
    expect(painted).toHaveLength(6);
  });

  it("works in device pixels: at a pixel ratio of 2 a one-CSS-pixel pan is a two-pixel copy", () => {
    const { draw, screen } = setup(2);
    draw(v0);
    draw(v0);
    expect(screen.calls.at(-1)).toEqual({ op: "drawImage", args: [-2 * M, -2 * M] });
    expect(draw({ ...v0, ox: v0.ox + 1 })).toBe("blit");
    expect(screen.calls.at(-1)).toEqual({ op: "drawImage", args: [-2 * M + 2, -2 * M] });
  });
});

describe("createViewStore", () => {
  it("tells its listeners of each change, not of a repeat, and stops after unsubscribing", () => {
    const store = createViewStore();
    const heard = vi.fn();
    const stop = store.subscribe(heard);
    expect(store.get()).toBeNull();
    store.set(v0);
    store.set({ ...v0 });
    store.set({ ...v0, ox: 1 });
    expect(heard).toHaveBeenCalledTimes(2);
    expect(store.get()).toEqual({ ...v0, ox: 1 });
    stop();
    store.set(v0);
    expect(heard).toHaveBeenCalledTimes(2);
  });

  it("refuses a view that is not one", () => {
    const store = createViewStore();
    expect(() => store.set({ scale: 0, ox: 0, oy: 0 })).toThrow(/not a plan view/);
    expect(() => store.set({ scale: 2, ox: NaN, oy: 0 })).toThrow(/not a plan view/);
    expect(store.get()).toBeNull();
  });
});
