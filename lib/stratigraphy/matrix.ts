import type { RelationKind } from "@/lib/schemas/relation";

/**
 * The Harris matrix as a graph (Harris 1979, "Principles of Archaeological Stratigraphy"): every
 * "above", "cuts" and "fills" relation says its `from` context is later than its `to` context; "same as"
 * joins contexts into one node. Pure functions: no database, so tests, the import and the device (its
 * offline loop check, lib/offline) use the same ones.
 */
export type MatrixContext = { id: string; number: number };
export type MatrixRelation = { id: string; fromId: string; toId: string; kind: RelationKind };

/** A node of the matrix: one context, or several joined by "same as" (numbers ascending). */
export type MatrixNode = { key: string; members: MatrixContext[]; label: string };

/** A later-than edge between two nodes, with the relation it came from. */
export type MatrixEdge = {
  relation: MatrixRelation;
  from: string;
  to: string;
  /** Implied by a longer path (transitive reduction), or a second relation between the same two nodes. */
  redundant: boolean;
};

export type Matrix = { nodes: MatrixNode[]; edges: MatrixEdge[]; loop: string | null };

const kindWords: Record<RelationKind, string> = { above: "above", cuts: "cuts", fills: "fills", same_as: "same as" };

/** Union–find over "same as": each context maps to the id of its group's representative. */
function sameAsGroups(contexts: MatrixContext[], relations: MatrixRelation[]): Map<string, string> {
  const parent = new Map(contexts.map((c) => [c.id, c.id]));
  const find = (id: string): string => {
    let root = id;
    while (parent.get(root) !== root) root = parent.get(root)!;
    parent.set(id, root);
    return root;
  };
  for (const r of relations) {
    if (r.kind !== "same_as" || !parent.has(r.fromId) || !parent.has(r.toId)) continue;
    const a = find(r.fromId);
    const b = find(r.toId);
    if (a !== b) parent.set(b, a);
  }
  return new Map(contexts.map((c) => [c.id, find(c.id)]));
}

/** Names a loop from its relations in order, e.g. "1004 above 1007 same as 1008 above 1004". */
export function nameLoop(path: MatrixRelation[], numberOf: (id: string) => number): string {
  if (path.length === 0) return "";
  const first = numberOf(path[0].fromId);
  let text = String(first);
  let at = path[0].fromId;
  for (const r of path) {
    if (r.fromId !== at) text += ` same as ${numberOf(r.fromId)}`;
    text += ` ${kindWords[r.kind]} ${numberOf(r.toId)}`;
    at = r.toId;
  }
  if (at !== path[0].fromId) text += ` same as ${first}`;
  return text;
}

type Graph = { group: Map<string, string>; out: Map<string, MatrixRelation[]> };

function laterThanGraph(contexts: MatrixContext[], relations: MatrixRelation[]): Graph {
  const group = sameAsGroups(contexts, relations);
  const out = new Map<string, MatrixRelation[]>();
  for (const r of relations) {
    if (r.kind === "same_as") continue;
    const g = group.get(r.fromId);
    if (g === undefined || !group.has(r.toId)) continue;
    const list = out.get(g) ?? [];
    list.push(r);
    out.set(g, list);
  }
  return { group, out };
}

/** Shortest chain of relations leading from group `start` to group `goal` (breadth first), or null. */
function chain(g: Graph, start: string, goal: string): MatrixRelation[] | null {
  if (start === goal) return [];
  const via = new Map<string, MatrixRelation>([[start, null as unknown as MatrixRelation]]);
  const queue = [start];
  for (let i = 0; i < queue.length; i++) {
    for (const r of g.out.get(queue[i]) ?? []) {
      const next = g.group.get(r.toId)!;
      if (via.has(next)) continue;
      via.set(next, r);
      if (next === goal) {
        const path: MatrixRelation[] = [];
        for (let at = goal; at !== start; at = g.group.get(via.get(at)!.fromId)!) path.unshift(via.get(at)!);
        return path;
      }
      queue.push(next);
    }
  }
  return null;
}

/**
 * If adding `candidate` to `relations` would make the matrix loop back on itself, names the loop
 * (starting with the candidate); otherwise null.
 */
export function loopIfAdded(
  contexts: MatrixContext[],
  relations: MatrixRelation[],
  candidate: MatrixRelation,
): string | null {
  const numbers = new Map(contexts.map((c) => [c.id, c.number]));
  const numberOf = (id: string) => numbers.get(id) ?? NaN;
  const g = laterThanGraph(contexts, relations);
  const a = g.group.get(candidate.fromId)!;
  const b = g.group.get(candidate.toId)!;
  if (candidate.kind === "same_as") {
    const back = chain(g, a, b) ?? chain(g, b, a);
    if (!back || back.length === 0) return null;
    // The chain runs between the two contexts the candidate joins; the candidate closes it.
    const startsAtFrom = g.group.get(back[0].fromId) === a;
    const path = startsAtFrom
      ? [...back, { ...candidate, fromId: candidate.toId, toId: candidate.fromId }]
      : [...back, candidate];
    return nameLoop(path, numberOf);
  }
  const back = chain(g, b, a);
  return back ? nameLoop([candidate, ...back], numberOf) : null;
}

/** Finds any loop already in the graph (depth first), for records that predate the check. */
function anyLoop(g: Graph, numberOf: (id: string) => number): string | null {
  const state = new Map<string, 1 | 2>();
  const stack: MatrixRelation[] = [];
  const visit = (node: string): string | null => {
    state.set(node, 1);
    for (const r of g.out.get(node) ?? []) {
      const next = g.group.get(r.toId)!;
      stack.push(r);
      if (state.get(next) === 1) {
        const start = stack.findIndex((s) => g.group.get(s.fromId) === next);
        return nameLoop(stack.slice(start), numberOf);
      }
      if (!state.has(next)) {
        const found = visit(next);
        if (found) return found;
      }
      stack.pop();
    }
    state.set(node, 2);
    return null;
  };
  for (const node of new Set(g.group.values())) {
    if (!state.has(node)) {
      const found = visit(node);
      if (found) return found;
    }
  }
  return null;
}

/** Nodes, edges and, for a loop-free graph, which edges the transitive reduction drops. */
export function buildMatrix(contexts: MatrixContext[], relations: MatrixRelation[]): Matrix {
  const g = laterThanGraph(contexts, relations);
  const byId = new Map(contexts.map((c) => [c.id, c]));
  const members = new Map<string, MatrixContext[]>();
  for (const c of contexts) members.set(g.group.get(c.id)!, [...(members.get(g.group.get(c.id)!) ?? []), c]);
  const nodes = [...members.entries()].map(([key, list]) => {
    const sorted = [...list].sort((p, q) => p.number - q.number);
    return { key, members: sorted, label: sorted.map((m) => m.number).join(" = ") };
  });
  nodes.sort((p, q) => p.members[0].number - q.members[0].number);
  const edges: MatrixEdge[] = [];
  for (const list of g.out.values()) {
    for (const r of list)
      edges.push({ relation: r, from: g.group.get(r.fromId)!, to: g.group.get(r.toId)!, redundant: false });
  }
  const loop = anyLoop(g, (id) => byId.get(id)?.number ?? NaN);
  if (!loop)
    markRedundant(
      nodes.map((n) => n.key),
      edges,
    );
  return { nodes, edges, loop };
}

/**
 * Transitive reduction of a DAG (Aho, Garey & Ullman 1972): an edge u→v is redundant when v can be
 * reached from u through another successor. Reachability is a bit set per node, filled in reverse
 * topological order.
 */
function markRedundant(keys: string[], edges: MatrixEdge[]): void {
  const index = new Map(keys.map((k, i) => [k, i]));
  const n = keys.length;
  const words = Math.ceil(n / 32);
  const succ: number[][] = keys.map(() => []);
  const indeg = new Int32Array(n);
  for (const e of edges) {
    succ[index.get(e.from)!].push(index.get(e.to)!);
    indeg[index.get(e.to)!]++;
  }
  const order: number[] = [];
  for (let i = 0; i < n; i++) if (indeg[i] === 0) order.push(i);
  for (let i = 0; i < order.length; i++) for (const s of succ[order[i]]) if (--indeg[s] === 0) order.push(s);
  // reach[u] = nodes reachable from u by a path of one or more edges.
  const reach = keys.map(() => new Uint32Array(words));
  for (let i = order.length - 1; i >= 0; i--) {
    const u = order[i];
    for (const s of succ[u]) {
      reach[u][s >>> 5] |= 1 << (s & 31);
      for (let w = 0; w < words; w++) reach[u][w] |= reach[s][w];
    }
  }
  const has = (u: number, v: number) => (reach[u][v >>> 5] & (1 << (v & 31))) !== 0;
  const seen = new Set<string>();
  for (const e of edges) {
    const u = index.get(e.from)!;
    const v = index.get(e.to)!;
    const pair = `${u}>${v}`;
    if (seen.has(pair)) e.redundant = true;
    seen.add(pair);
    if (!e.redundant) e.redundant = succ[u].some((s) => s !== v && has(s, v));
  }
}
