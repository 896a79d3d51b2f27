import dagre from "@dagrejs/dagre";
import type { Matrix } from "@/lib/server/matrix";

/** What the drawing needs to know about each context besides its number. */
export type NodeInfo = { type: string; state: string };

export type MatrixDrawing = { svg: string; width: number; height: number };

const esc = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

const charW = 9.6;
const boxH = 46;
const pad = 24;
const ink = "#2e2116";
const faint = "#8a7660";
const stateMarks: Record<string, string> = { open: "", awaiting: " · awaiting", signed_off: " · signed off" };

/**
 * Lays the matrix out with dagre (the layered Sugiyama-style layout of Gansner et al. 1993), latest
 * contexts at the top, and draws it as a standalone SVG. The layout sees only the transitive reduction;
 * redundant relations are added afterwards as dashed curves, so they do not pull the layers about.
 * `linkOf` gives the sheet address of each context (omit for a downloaded file).
 */
export function drawMatrix(
  matrix: Matrix,
  info: Map<string, NodeInfo>,
  linkOf?: (contextId: string) => string,
): MatrixDrawing {
  const g = new dagre.graphlib.Graph({ multigraph: true });
  g.setGraph({ rankdir: "TB", nodesep: 28, ranksep: 44, marginx: pad, marginy: pad });
  g.setDefaultEdgeLabel(() => ({}));
  for (const n of matrix.nodes) g.setNode(n.key, { width: Math.max(72, n.label.length * charW + 28), height: boxH });
  // Only the relations the matrix needs take part in the layout; redundant ones are drawn on top.
  matrix.edges.forEach((e, i) => {
    if (e.from !== e.to && !e.redundant) g.setEdge(e.from, e.to, { weight: 1, minlen: 1 }, `e${i}`);
  });
  dagre.layout(g);
  const { width = 0, height = 0 } = g.graph();
  const parts: string[] = [];
  matrix.edges.forEach((e, i) => {
    if (e.from === e.to) return;
    let d: string;
    if (e.redundant) {
      // A dashed curve bowed to one side, from the bottom of the later box to the top of the earlier one.
      const a = g.node(e.from);
      const b = g.node(e.to);
      const [x1, y1, x2, y2] = [a.x, a.y + a.height / 2, b.x, b.y - b.height / 2];
      const bow = Math.max(a.width, b.width) / 2 + 18;
      d = `M${x1.toFixed(1)},${y1.toFixed(1)} C${(x1 - bow).toFixed(1)},${(y1 + 30).toFixed(1)} ${(x2 - bow).toFixed(1)},${(y2 - 30).toFixed(1)} ${x2.toFixed(1)},${y2.toFixed(1)}`;
    } else {
      const pts: { x: number; y: number }[] = g.edge({ v: e.from, w: e.to, name: `e${i}` })?.points ?? [];
      if (pts.length < 2) return;
      d = pts.map((p, k) => `${k ? "L" : "M"}${p.x.toFixed(1)},${p.y.toFixed(1)}`).join(" ");
    }
    const style = e.redundant ? `stroke="${faint}" stroke-dasharray="5 4"` : `stroke="${ink}"`;
    parts.push(
      `<path d="${d}" fill="none" stroke-width="1.5" ${style} marker-end="url(#${e.redundant ? "tip-faint" : "tip"})"><title>${e.redundant ? "redundant: " : ""}${esc(e.relation.kind)}</title></path>`,
    );
  });
  for (const n of matrix.nodes) {
    const box = g.node(n.key);
    const x = box.x - box.width / 2;
    const y = box.y - box.height / 2;
    const [lead] = n.members;
    const first = lead && info.get(lead.id);
    const locked = n.members.every((m) => info.get(m.id)?.state === "signed_off");
    parts.push(`<g class="ctx" data-node="${esc(n.label)}">`);
    parts.push(
      `<rect x="${x.toFixed(1)}" y="${y.toFixed(1)}" width="${box.width.toFixed(1)}" height="${box.height}" rx="3" fill="#ffffff" stroke="${ink}" stroke-width="${locked ? 3 : 1.5}"/>`,
    );
    // Each member number is its own link, so a "same as" group still opens the right sheet.
    let cx = box.x - ((n.label.length - 1) * charW) / 2;
    n.members.forEach((m, k) => {
      const text = `${k ? "= " : ""}${m.number}`;
      const tx = cx + ((text.length - 1) * charW) / 2;
      const label = `<text x="${tx.toFixed(1)}" y="${(box.y - 2).toFixed(1)}" text-anchor="middle" font-family="IBM Plex Mono, monospace" font-size="16" font-weight="700" fill="${ink}">${esc(text)}</text>`;
      parts.push(linkOf ? `<a href="${esc(linkOf(m.id))}" aria-label="Context ${m.number}">${label}</a>` : label);
      cx += (text.length + 1) * charW;
    });
    const sub = `${first?.type ?? ""}${stateMarks[first?.state ?? "open"] ?? ""}`;
    parts.push(
      `<text x="${box.x.toFixed(1)}" y="${(box.y + 15).toFixed(1)}" text-anchor="middle" font-family="Source Serif 4, Georgia, serif" font-size="11" fill="${faint}">${esc(sub)}</text>`,
    );
    parts.push(`</g>`);
  }
  const marker = (id: string, colour: string) =>
    `<marker id="${id}" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" markerHeight="7" orient="auto-start-reverse"><path d="M0,0 L10,5 L0,10 z" fill="${colour}"/></marker>`;
  const w = Math.ceil(width);
  const h = Math.ceil(height);
  // With links inside, the drawing is a group of links (an image's children are hidden from assistive
  // technology, so links inside one could not be reached); without, it is one image.
  const svg =
    `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}" role="${linkOf ? "group" : "img"}" aria-label="Harris matrix">` +
    `<defs>${marker("tip", ink)}${marker("tip-faint", faint)}</defs>` +
    `<rect width="100%" height="100%" fill="#f7f2e8"/>${parts.join("")}</svg>`;
  return { svg, width: w, height: h };
}
