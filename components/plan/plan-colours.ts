/**
 * The plan's colours in one place, so their contrast can be checked (the canvas is invisible to page
 * checkers): labels and controls at WCAG AAA (7:1), grid lines and find symbols at WCAG 2.2's 3:1 for
 * graphics (success criterion 1.4.11) against the paper, the dug trench and a photo.
 */
import { colord, extend } from "colord";
import a11yPlugin from "colord/plugins/a11y";

extend([a11yPlugin]);

export const INK = "#1b130c";
export const WARN = "#b8400f";
export const ACCENT = "#1d5c8c";
/** Context extents: their dashed outline and number label. */
export const EXTENT = "#5a2d82";
/** The canvas behind the plan (the theme's deep paper) and the dug area inside the trench outline. */
export const PLAN_PAPER = "#efe6d3";
export const TRENCH_FILL = "#eadcc0";
/** Behind the grid's coordinate labels, over paper or photo alike. */
export const LABEL_BACK = "rgba(247,242,232,0.92)";
/** Grid lines: on paper, and the light line of the pair drawn over a photo (its dark twin below). */
export const GRID_LINE = "rgba(46,33,22,0.6)";
export const GRID_LINE_PHOTO = "rgba(255,255,255,0.85)";
export const GRID_LINE_PHOTO_DARK = "rgba(27,19,12,0.6)";
/** The light halo, for a class colour too dark to stand out against the dark one. */
export const LIGHT_HALO = "#ffffff";

/** WCAG 2.2 contrast ratio of two opaque colours. */
export const contrast = (a: string, b: string) => colord(a).contrast(b);

/** A colour with alpha laid over an opaque background, as the canvas composes it (source-over, sRGB). */
export function over(top: string, back: string): string {
  const t = colord(top).toRgb();
  const b = colord(back).toRgb();
  const mix = (x: number, y: number) => Math.round(x * t.a + y * (1 - t.a));
  return colord({ r: mix(t.r, b.r), g: mix(t.g, b.g), b: mix(t.b, b.b) }).toHex();
}

/**
 * The outline (filled symbols) or halo (open symbols) drawn round a class colour: dark ink, unless the
 * colour itself is too dark to part from it at 3:1 (a black class), when the halo is white.
 */
export function haloFor(colour: string): string {
  return contrast(colour, INK) >= 3 ? INK : LIGHT_HALO;
}
