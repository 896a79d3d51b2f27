import { symbolPath, type SymbolShape } from "@/lib/geometry/symbol-paths";
import { projectSection, type SectionLine } from "./section";

/**
 * A section of finds as a figure (field.md, "Sections of finds"): the finds within the band projected onto the
 * line (projectSection), drawn as distance along the line × reduced level at the exaggeration chosen, with
 * the tops and bases of their contexts where levels exist. Pure: the plan's preview, the exports and the
 * printed trench record all draw it from here.
 */
export type SectionFind = {
  number: number;
  x: number;
  y: number;
  z: number | null;
  contextNumber: number;
  classCode: string;
  colour: string;
  symbol: string;
};
export type ContextLevels = { number: number; top: number | null; base: number | null };

export type SectionFigure = {
  name: string;
  length: number;
  halfWidth: number;
  exaggeration: number;
  finds: (Omit<SectionFind, "x" | "y" | "z"> & { along: number; offset: number; level: number })[];
  /** Numbers of finds inside the band with no reduced level: left off the figure, and said so. */
  withoutLevel: number[];
  /** A context's top and base, drawn across the stretch of the line where its finds lie. */
  horizons: { contextNumber: number; top: number | null; base: number | null; from: number; to: number }[];
};

export function buildSectionFigure(
  name: string,
  line: SectionLine,
  exaggeration: number,
  finds: readonly SectionFind[],
  contexts: readonly ContextLevels[],
): SectionFigure {
  if (!(exaggeration > 0) || !Number.isFinite(exaggeration))
    throw new RangeError("The vertical exaggeration must be a number above 0.");
  const s = projectSection(
    line,
    finds.map((f) => ({ x: f.x, y: f.y, level: f.z, item: f })),
  );
  const projected = s.finds.map((p) => ({
    number: p.item.number,
    contextNumber: p.item.contextNumber,
    classCode: p.item.classCode,
    colour: p.item.colour,
    symbol: p.item.symbol,
    along: p.along,
    offset: p.offset,
    level: p.level,
  }));
  const horizons: SectionFigure["horizons"] = [];
  for (const c of contexts) {
    if (c.top === null && c.base === null) continue;
    const mine = projected.filter((f) => f.contextNumber === c.number);
    if (mine.length === 0) continue;
    const pad = Math.min(0.1, s.length / 20);
    horizons.push({
      contextNumber: c.number,
      top: c.top,
      base: c.base,
      from: Math.max(0, Math.min(...mine.map((f) => f.along)) - pad),
      to: Math.min(s.length, Math.max(...mine.map((f) => f.along)) + pad),
    });
  }
  return {
    name,
    length: s.length,
    halfWidth: line.halfWidth,
    exaggeration,
    finds: projected,
    withoutLevel: s.withoutLevel.map((f) => f.number),
    horizons,
  };
}

const esc = (t: string) =>
  t.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
const fmt = (v: number, dp = 3) => v.toFixed(dp);
const colourOk = (c: string) => (/^#[0-9a-f]{3,8}$/i.test(c) ? c : "#000000");

/** Tick spacing of 1, 2 or 5 × 10^k giving about `count` ticks over `span`. */
export function niceStep(span: number, count: number): number {
  const raw = span / Math.max(1, count);
  const p = 10 ** Math.floor(Math.log10(raw));
  const m = raw / p;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10) * p;
}

/** Short statement of the figure's band and exaggeration; the figure and its exports carry it. */
export function sectionCaption(fig: Pick<SectionFigure, "halfWidth" | "exaggeration">, datumName: string): string {
  return `Finds within ${fmt(fig.halfWidth, 2)} m either side of the line (band ${fmt(fig.halfWidth * 2, 2)} m wide), projected onto it. Across: metres along the line from its start. Up: reduced level, m above ${datumName}. Vertical exaggeration ×${Number(fig.exaggeration.toFixed(2))}.`;
}

/**
 * The figure as a standalone SVG document. Every find is a <g data-find="N"> with its class symbol, so a
 * reader (or a test) can list the finds drawn. Presentation attributes only: no inline styles.
 */
export function sectionSvg(
  fig: SectionFigure,
  opts: { title: string; datumName: string; width?: number; maxHeight?: number },
): string {
  const width = opts.width ?? 900;
  const left = 72,
    right = 24,
    top = 48,
    bottom = 84;
  const plotW = width - left - right;
  const levels = [
    ...fig.finds.map((f) => f.level),
    ...fig.horizons.flatMap((h) => [h.top, h.base].filter((v): v is number => v !== null)),
  ];
  let lo = levels.length ? Math.min(...levels) : 0;
  let hi = levels.length ? Math.max(...levels) : 1;
  const padZ = Math.max(0.05, (hi - lo) * 0.08);
  lo -= padZ;
  hi += padZ;
  // One scale for both axes, the vertical multiplied by the exaggeration; a tall figure is shrunk whole.
  const maxPlotH = (opts.maxHeight ?? 1400) - top - bottom;
  const scale = Math.min(plotW / fig.length, maxPlotH / ((hi - lo) * fig.exaggeration));
  const sx = scale;
  const sy = scale * fig.exaggeration;
  const plotWUsed = fig.length * sx;
  const plotH = (hi - lo) * sy;
  const height = Math.ceil(top + plotH + bottom);
  const X = (a: number) => left + a * sx;
  const Y = (z: number) => top + (hi - z) * sy;
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="${esc(opts.title)}" data-section="${esc(fig.name)}" data-band-half-width="${fig.halfWidth}" data-exaggeration="${fig.exaggeration}" font-family="serif" font-size="12">`,
  );
  out.push(`<title>${esc(opts.title)}</title>`);
  out.push(`<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`);
  out.push(`<text x="${left}" y="20" font-size="15" font-weight="bold" fill="#1b130c">${esc(opts.title)}</text>`);
  out.push(
    `<text x="${left}" y="38" font-size="11" fill="#3a2c1e">Band ±${fmt(fig.halfWidth, 2)} m · vertical exaggeration ×${Number(fig.exaggeration.toFixed(2))} · ${fig.finds.length} finds drawn</text>`,
  );
  // Axes and grid.
  out.push(
    `<g stroke="#8a7660" stroke-width="1" fill="none"><rect x="${left}" y="${top}" width="${fmt(plotWUsed, 2)}" height="${fmt(plotH, 2)}"/></g>`,
  );
  const stepA = niceStep(fig.length, 8);
  const ticks: string[] = [];
  for (let a = 0; a <= fig.length + 1e-9; a += stepA) {
    ticks.push(
      `<line x1="${fmt(X(a), 2)}" y1="${fmt(top + plotH, 2)}" x2="${fmt(X(a), 2)}" y2="${fmt(top + plotH + 5, 2)}" stroke="#3a2c1e"/><text x="${fmt(X(a), 2)}" y="${fmt(top + plotH + 18, 2)}" text-anchor="middle" fill="#3a2c1e">${Number(a.toFixed(3))}</text>`,
    );
  }
  const stepZ = niceStep(hi - lo, Math.max(3, Math.round(plotH / 60)));
  for (let z = Math.ceil(lo / stepZ) * stepZ; z <= hi + 1e-9; z += stepZ) {
    ticks.push(
      `<line x1="${left - 5}" y1="${fmt(Y(z), 2)}" x2="${fmt(left + plotWUsed, 2)}" y2="${fmt(Y(z), 2)}" stroke="#e4dccd"/><text x="${left - 8}" y="${fmt(Y(z) + 4, 2)}" text-anchor="end" fill="#3a2c1e">${z.toFixed(stepZ < 0.01 ? 3 : 2)}</text>`,
    );
  }
  out.push(`<g>${ticks.join("")}</g>`);
  out.push(
    `<text x="${fmt(left + plotWUsed / 2, 2)}" y="${fmt(top + plotH + 36, 2)}" text-anchor="middle" fill="#1b130c">Distance along the section line (m)</text>`,
  );
  out.push(
    `<text transform="translate(16 ${fmt(top + plotH / 2, 2)}) rotate(-90)" text-anchor="middle" fill="#1b130c">RL (m above ${esc(opts.datumName)})</text>`,
  );
  // Context tops and bases.
  for (const h of fig.horizons) {
    for (const [kind, z] of [
      ["top", h.top],
      ["base", h.base],
    ] as const) {
      if (z === null) continue;
      out.push(
        `<g data-horizon="${h.contextNumber}" data-kind="${kind}"><line x1="${fmt(X(h.from), 2)}" y1="${fmt(Y(z), 2)}" x2="${fmt(X(h.to), 2)}" y2="${fmt(Y(z), 2)}" stroke="#5a4632" stroke-width="1.2" stroke-dasharray="${kind === "top" ? "6 3" : "2 3"}"/><text x="${fmt(X(h.to) + 3, 2)}" y="${fmt(Y(z) + 4, 2)}" font-size="10" fill="#5a4632">${h.contextNumber} ${kind}</text></g>`,
      );
    }
  }
  // Finds: class symbol in class colour, radius 5 px.
  for (const f of fig.finds) {
    const d = symbolPath[f.symbol as SymbolShape] ?? symbolPath.disc;
    out.push(
      `<g data-find="${f.number}" data-context="${f.contextNumber}" transform="translate(${fmt(X(f.along), 2)} ${fmt(Y(f.level), 2)}) scale(5)"><title>Find ${f.number} · ${esc(f.classCode)} · context ${f.contextNumber} · RL ${fmt(f.level)} m · ${fmt(f.along, 2)} m along</title><path d="${d}" fill="${colourOk(f.colour)}" fill-rule="evenodd" stroke="#2e2116" stroke-width="0.18"/></g>`,
    );
  }
  const caption = sectionCaption(fig, opts.datumName);
  out.push(
    `<text x="${left}" y="${height - 26}" font-size="11" fill="#1b130c">${esc(caption.slice(0, caption.indexOf(" Across")))}</text>`,
  );
  const missing = fig.withoutLevel.length
    ? ` ${fig.withoutLevel.length} find(s) in the band have no level and are not drawn: ${fig.withoutLevel.slice(0, 20).join(", ")}${fig.withoutLevel.length > 20 ? ", …" : ""}.`
    : "";
  out.push(
    `<text x="${left}" y="${height - 10}" font-size="11" fill="#1b130c">${esc(caption.slice(caption.indexOf("Across")) + missing)}</text>`,
  );
  out.push("</svg>");
  return out.join("\n");
}

/** One row per find drawn: where it lies along and off the line, and its reduced level. */
export function sectionCsvRows(fig: SectionFigure) {
  return fig.finds.map((f) => ({
    number: f.number,
    context: f.contextNumber,
    class: f.classCode,
    along_m: Number(f.along.toFixed(3)),
    offset_m: Number(f.offset.toFixed(3)),
    z_rl_m: f.level,
  }));
}
