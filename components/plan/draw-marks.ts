/** Marks over the finds: selection, the spot being recorded, a refused spot, photo-fit points. */
import { formatMetres, toScreen, type View } from "@/lib/geometry/plan-view";
import type { Pt } from "@/lib/geometry/outline-edit";
import { ofLength } from "@/lib/geometry/small-linalg";
import { ACCENT, INK, WARN } from "./draw";

export type Refused = { at: Pt; nearest: Pt; distance: number };
export type FitMark = { x: number; y: number; label: string; residual?: number };
export type Photo = { img: HTMLImageElement | null; matrix: number[]; opacity: number };

export function drawSelection(c: CanvasRenderingContext2D, v: View, pts: Pt[]) {
  c.save();
  for (const p of pts) {
    const [sx, sy] = toScreen(v, ...p);
    c.beginPath();
    c.arc(sx, sy, 14, 0, Math.PI * 2);
    c.strokeStyle = "#fff";
    c.lineWidth = 6;
    c.stroke();
    c.strokeStyle = ACCENT;
    c.lineWidth = 3;
    c.stroke();
  }
  c.restore();
}

export function drawPlacing(c: CanvasRenderingContext2D, v: View, p: Pt) {
  const [sx, sy] = toScreen(v, ...p);
  c.save();
  c.strokeStyle = "#fff";
  c.lineWidth = 6;
  c.beginPath();
  c.moveTo(sx - 16, sy);
  c.lineTo(sx + 16, sy);
  c.moveTo(sx, sy - 16);
  c.lineTo(sx, sy + 16);
  c.stroke();
  c.strokeStyle = ACCENT;
  c.lineWidth = 2.5;
  c.stroke();
  c.beginPath();
  c.arc(sx, sy, 10, 0, Math.PI * 2);
  c.stroke();
  c.restore();
}

export function drawRefused(c: CanvasRenderingContext2D, v: View, r: Refused, width: number) {
  const [sx, sy] = toScreen(v, ...r.at);
  const [nx, ny] = toScreen(v, ...r.nearest);
  c.save();
  c.strokeStyle = WARN;
  c.lineWidth = 2.5;
  c.setLineDash([6, 4]);
  c.beginPath();
  c.moveTo(sx, sy);
  c.lineTo(nx, ny);
  c.stroke();
  c.setLineDash([]);
  c.lineWidth = 4;
  c.beginPath();
  c.moveTo(sx - 10, sy - 10);
  c.lineTo(sx + 10, sy + 10);
  c.moveTo(sx + 10, sy - 10);
  c.lineTo(sx - 10, sy + 10);
  c.stroke();
  const text = `outside by ${formatMetres(r.distance)}`;
  c.font = "700 14px var(--font-mono), ui-monospace, monospace";
  const tw = c.measureText(text).width;
  // Keep the label on the canvas: to the left of the mark when the mark is near the right edge.
  const left = sx + 14 + tw + 12 > width ? sx - 14 - tw - 12 : sx + 14;
  c.fillStyle = WARN;
  c.fillRect(left, sy - 12, tw + 12, 24);
  c.fillStyle = "#fff";
  c.textBaseline = "middle";
  c.fillText(text, left + 6, sy);
  c.restore();
}

export function drawFitMarks(c: CanvasRenderingContext2D, v: View, marks: FitMark[]) {
  c.save();
  c.font = "700 13px var(--font-mono), ui-monospace, monospace";
  c.textBaseline = "middle";
  for (const m of marks) {
    const [sx, sy] = toScreen(v, m.x, m.y);
    c.beginPath();
    c.arc(sx, sy, 11, 0, Math.PI * 2);
    c.fillStyle = "#fff";
    c.fill();
    c.strokeStyle = INK;
    c.lineWidth = 2.5;
    c.stroke();
    c.fillStyle = INK;
    c.textAlign = "center";
    c.fillText(m.label, sx, sy + 0.5);
  }
  c.restore();
}

/** The fitted photo, drawn with its affine transform composed with the view (exact for similarity and affine). */
export function drawPhoto(c: CanvasRenderingContext2D, v: View, p: Photo) {
  if (!p.img || !p.img.complete || !p.img.naturalWidth) return;
  // A stored fit that lost entries is not drawn (as the server refuses to use one).
  const m = ofLength(p.matrix, 9);
  if (!m) return;
  const [a, b, cc, d, e, f] = m;
  const s = v.scale;
  c.save();
  c.globalAlpha = p.opacity;
  c.imageSmoothingQuality = "high";
  c.transform(s * a, -s * d, s * b, -s * e, s * cc + v.ox, -s * f + v.oy);
  c.drawImage(p.img, 0, 0);
  c.restore();
}
