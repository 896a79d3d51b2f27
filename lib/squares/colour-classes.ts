/**
 * Shading squares by value: a colour-blind-safe sequential scale and the classes values fall into.
 *
 * The scale is viridis (van der Walt & Smith 2015, matplotlib's default map, designed to stay ordered in
 * lightness for the common colour-vision deficiencies and in grey print). Its seven stops at t = 0, 1/6,
 * …, 1 are as d3-scale-chromatic 3.1 `interpolateViridis` gives them; between stops the colour is mixed
 * linearly in RGB, which is close to the map for so few classes.
 */

import { quantileSorted } from "d3-array";
export const VIRIDIS_STOPS = ["#440154", "#443983", "#31688e", "#21918c", "#35b779", "#90d743", "#fde725"] as const;

export type Classing = "quantile" | "equal";

export const classingWords: Record<Classing, string> = {
  quantile: "quantile classes (about as many squares in each)",
  equal: "equal-interval classes",
};

const hex = (s: string, k: number) => parseInt(s.slice(1 + 2 * k, 3 + 2 * k), 16);

/** The scale's colour at t in [0, 1]. */
export function viridis(t: number): string {
  const x = Math.max(0, Math.min(1, t)) * (VIRIDIS_STOPS.length - 1);
  const i = Math.min(VIRIDIS_STOPS.length - 2, Math.floor(x));
  const f = x - i;
  const a = VIRIDIS_STOPS[i]!;
  const b = VIRIDIS_STOPS[i + 1]!;
  const mix = (k: number) =>
    Math.round(hex(a, k) * (1 - f) + hex(b, k) * f)
      .toString(16)
      .padStart(2, "0");
  return `#${mix(0)}${mix(1)}${mix(2)}`;
}

export type ClassScale = { classing: Classing; breaks: number[]; colours: string[] };

/**
 * Class breaks for the values above 0 (0 and unexcavated squares are drawn apart, not shaded): `k`
 * classes, b[0] = smallest, b[k] = largest. Quantile breaks that coincide (many equal values) are merged,
 * so fewer classes may come back; one value gives one class.
 */
export function classBreaks(values: readonly number[], classing: Classing, k = 5): ClassScale {
  const sorted = values.filter((v) => v > 0 && Number.isFinite(v)).sort((a, b) => a - b);
  if (!sorted.length) return { classing, breaks: [], colours: [] };
  const lo = sorted[0]!;
  const hi = sorted[sorted.length - 1]!;
  let breaks: number[];
  if (lo === hi) breaks = [lo, hi];
  else if (classing === "equal")
    breaks = Array.from({ length: k + 1 }, (_, i) => (i === k ? hi : lo + ((hi - lo) * i) / k));
  // d3-array's quantileSorted is R's type 7 (linear between order statistics); `sorted` is not empty here.
  else breaks = [...new Set(Array.from({ length: k + 1 }, (_, i) => quantileSorted(sorted, i / k)!))];
  const n = breaks.length - 1;
  const colours = Array.from({ length: n }, (_, i) => viridis(n === 1 ? 1 : i / (n - 1)));
  return { classing, breaks, colours };
}

/** The class of v: class i holds (b[i], b[i+1]], the first also its lower end. −1 for 0 or no value. */
export function classOf(scale: ClassScale, v: number | null): number {
  if (v === null || !(v > 0) || !scale.colours.length) return -1;
  for (let i = 0; i < scale.colours.length; i++)
    if (v <= scale.breaks[i + 1]! + 1e-12 * Math.abs(scale.breaks[i + 1]!)) return i;
  return scale.colours.length - 1;
}

/** "2.5", "12", "0.031": enough figures to tell classes apart. */
export function formatValue(v: number): string {
  if (v === 0) return "0";
  const digits = Math.abs(v) >= 100 ? 0 : Math.abs(v) >= 10 ? 1 : Math.abs(v) >= 1 ? 2 : 3;
  return String(+v.toFixed(digits));
}

/** Legend lines, "1–4", "4–9.5", … */
export function classLabels(scale: ClassScale): string[] {
  return scale.colours.map((_, i) =>
    scale.breaks[i] === scale.breaks[i + 1]
      ? formatValue(scale.breaks[i]!)
      : `${formatValue(scale.breaks[i]!)}–${formatValue(scale.breaks[i + 1]!)}`,
  );
}
