/**
 * Are the chosen contexts one surface? Contexts joined by `same_as` are equivalent (one deposit recorded
 * under two numbers); contexts ordered by above / cuts / fills — directly or through other contexts of the
 * matrix — are not: their finds were laid down at different moments, and projecting them onto one plan
 * mixes those moments (statistics.md, cautions). Pure: takes the relation rows, returns warnings.
 */
export type RelationRow = { fromId: string; toId: string; kind: "above" | "cuts" | "fills" | "same_as" };
export type ContextLabel = { id: string; number: number };

export type StratWarning = { kind: "ordered" | "unrelated"; a: number; b: number; message: string };

function unionFind(ids: string[]) {
  const parent = new Map(ids.map((i) => [i, i]));
  const find = (x: string): string => {
    let r = x;
    while (parent.get(r) !== r) r = parent.get(r)!;
    parent.set(x, r);
    return r;
  };
  return { find, union: (a: string, b: string) => parent.set(find(a), find(b)) };
}

export function stratigraphicWarnings(
  chosen: ContextLabel[],
  allContextIds: string[],
  relations: RelationRow[],
): StratWarning[] {
  if (chosen.length < 2) return [];
  const uf = unionFind([...new Set([...allContextIds, ...relations.flatMap((r) => [r.fromId, r.toId])])]);
  for (const r of relations) if (r.kind === "same_as") uf.union(r.fromId, r.toId);
  // Order graph between equivalence groups: from is later than (above / cuts / fills) to.
  const later = new Map<string, Set<string>>();
  for (const r of relations) {
    if (r.kind === "same_as") continue;
    const a = uf.find(r.fromId),
      b = uf.find(r.toId);
    if (!later.has(a)) later.set(a, new Set());
    later.get(a)!.add(b);
  }
  const reaches = (from: string, to: string): boolean => {
    const seen = new Set<string>([from]);
    const stack = [from];
    while (stack.length) {
      for (const next of later.get(stack.pop()!) ?? []) {
        if (next === to) return true;
        if (!seen.has(next)) {
          seen.add(next);
          stack.push(next);
        }
      }
    }
    return false;
  };
  const out: StratWarning[] = [];
  for (const [i, p] of chosen.entries()) {
    for (const q of chosen.slice(i + 1)) {
      const gp = uf.find(p.id),
        gq = uf.find(q.id);
      if (gp === gq) continue;
      if (reaches(gp, gq) || reaches(gq, gp)) {
        const [late, early] = reaches(gp, gq) ? [p, q] : [q, p];
        out.push({
          kind: "ordered",
          a: late.number,
          b: early.number,
          message: `Context ${late.number} is later than ${early.number} in the matrix: they are not one surface, and their finds were laid down at different moments.`,
        });
      } else {
        out.push({
          kind: "unrelated",
          a: p.number,
          b: q.number,
          message: `No "same as" relation joins contexts ${p.number} and ${q.number}; nothing in the record says they are one surface.`,
        });
      }
    }
  }
  return out;
}
