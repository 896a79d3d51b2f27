/**
 * Export a drawn figure: the <svg> inside a container as an SVG file or a PNG (drawn at 2× on a canvas),
 * and the numbers behind it as CSV (papaparse). Browser only.
 */
import Papa from "papaparse";
import { inertText, quoteGuarded } from "@/lib/csv-cells";

function download(blob: Blob, name: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** The figure as standalone SVG text: namespaces set, a paper background, fonts named plainly. */
export function svgText(container: HTMLElement): string {
  const svg = container.querySelector("svg");
  if (!svg) throw new Error("There is no figure to export yet.");
  const copy = svg.cloneNode(true) as SVGSVGElement;
  const { width, height } = svg.getBoundingClientRect();
  copy.setAttribute("xmlns", "http://www.w3.org/2000/svg");
  copy.setAttribute("width", String(Math.round(width)));
  copy.setAttribute("height", String(Math.round(height)));
  copy.setAttribute("font-family", "Georgia, serif");
  const bg = document.createElementNS("http://www.w3.org/2000/svg", "rect");
  bg.setAttribute("width", "100%");
  bg.setAttribute("height", "100%");
  bg.setAttribute("fill", "#ffffff");
  copy.insertBefore(bg, copy.firstChild);
  return new XMLSerializer().serializeToString(copy);
}

export function exportSvg(container: HTMLElement, name: string): void {
  download(new Blob([svgText(container)], { type: "image/svg+xml" }), `${name}.svg`);
}

export async function exportPng(container: HTMLElement, name: string): Promise<void> {
  const text = svgText(container);
  const svg = container.querySelector("svg")!;
  const { width, height } = svg.getBoundingClientRect();
  const img = new Image();
  const url = URL.createObjectURL(new Blob([text], { type: "image/svg+xml" }));
  await new Promise<void>((resolve, reject) => {
    img.onload = () => resolve();
    img.onerror = () => reject(new Error("The figure could not be drawn as an image."));
    img.src = url;
  });
  const canvas = document.createElement("canvas");
  canvas.width = Math.round(width * 2);
  canvas.height = Math.round(height * 2);
  const g = canvas.getContext("2d")!;
  g.scale(2, 2);
  g.drawImage(img, 0, 0, width, height);
  URL.revokeObjectURL(url);
  const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, "image/png"));
  if (!blob) throw new Error("The browser could not make a PNG of this figure.");
  download(blob, `${name}.png`);
}

/** Numbers stay numbers; every text cell is made inert against spreadsheet formulas. */
export function plotCsv(rows: Record<string, number | string | null>[]): string {
  const safe = rows.map((r) =>
    Object.fromEntries(Object.entries(r).map(([k, v]) => [k, typeof v === "string" ? inertText(v) : v])),
  );
  return Papa.unparse(safe, { escapeFormulae: false, quotes: quoteGuarded, newline: "\r\n" });
}

export function exportCsv(rows: Record<string, number | string | null>[], name: string): void {
  download(new Blob([plotCsv(rows)], { type: "text/csv" }), `${name}.csv`);
}
