import "server-only";
import type { Db } from "@/db/client";
import { contexts } from "@/db/schema";
import { eq } from "drizzle-orm";
import { defaultRmax, roundMetres, DEFAULT_PARAMS } from "./defaults";
import type { ScopeDepthSummary, ScopeSummary } from "@/lib/api/patterns-responses";
import type { RunScope, TestKind } from "@/lib/schemas/run";
import { loadScope, siteRelations, type ScopeData } from "./scope-data";
import { stratigraphicWarnings, type StratWarning } from "@/lib/stratigraphy/one-surface";
import { LOW_POWER_N, MIN_POINTS } from "./thresholds";
import { DEFAULT_LEVEL_SPREAD_CAUTION, verticalSpread, type VerticalSpread } from "@/lib/levels/vertical-spread";

/** The depth part of the summary: the chosen spits named by context, and the finds left out, by number. */
export function depthSummary(data: ScopeData): ScopeDepthSummary | null {
  if (!data.depth) return null;
  const ctxNumber = new Map(data.contexts.map((c) => [c.id, c.number]));
  const d = data.depth;
  return {
    levelFrom: d.levelFrom,
    levelTo: d.levelTo,
    spits: d.spits
      .map((s) => ({
        id: s.id,
        label: `${ctxNumber.get(s.contextId)}/${s.number}`,
        topLevel: s.topLevel,
        baseLevel: s.baseLevel,
      }))
      .sort((a, b) => a.label.localeCompare(b.label, "en", { numeric: true })),
    noLevel: { count: d.noLevel.length, numbers: d.noLevel },
    noSpit: { count: d.noSpit.length, numbers: d.noSpit },
  };
}

/** Per class, the vertical spread of its finds in scope against the site's threshold. */
export function spreadsByClass(data: ScopeData, threshold: number): Map<string, VerticalSpread> {
  const levels = new Map<string, (number | null)[]>(data.classes.map((c) => [c.id, []]));
  for (const f of data.finds) levels.get(f.classId)?.push(f.z);
  return new Map(data.classes.map((c) => [c.id, verticalSpread(levels.get(c.id) ?? [], threshold)]));
}

export function countsByClass(data: ScopeData): Map<string, number> {
  const n = new Map<string, number>();
  for (const f of data.finds) n.set(f.classId, (n.get(f.classId) ?? 0) + 1);
  return n;
}

export async function stratWarningsFor(db: Db, siteId: string, data: ScopeData): Promise<StratWarning[]> {
  const [relations, all] = await Promise.all([
    siteRelations(db, siteId),
    db.select({ id: contexts.id }).from(contexts).where(eq(contexts.siteId, siteId)),
  ]);
  return stratigraphicWarnings(
    data.contexts,
    all.map((c) => c.id),
    relations,
  );
}

/** What the workspace shows before a run: n per class, which tests each class is too small for, warnings, defaults. */
export async function scopeSummary(
  db: Db,
  siteId: string,
  scope: RunScope,
  spreadThreshold: number = DEFAULT_LEVEL_SPREAD_CAUTION,
): Promise<ScopeSummary> {
  const data = await loadScope(db, siteId, scope);
  const n = countsByClass(data);
  const spreads = spreadsByClass(data, spreadThreshold);
  const { bbox } = data.window;
  return {
    trench: {
      id: data.trench.id,
      code: data.trench.code,
      area: data.window.area,
      shortSide: Math.min(bbox.maxX - bbox.minX, bbox.maxY - bbox.minY),
    },
    classes: data.classes.map((c) => {
      const count = n.get(c.id) ?? 0;
      return {
        id: c.id,
        code: c.code,
        label: c.label,
        colour: c.colour,
        symbol: c.symbol,
        n: count,
        lowPower: count < LOW_POWER_N,
        tooFewFor: (Object.keys(MIN_POINTS) as TestKind[]).filter((k) => count < MIN_POINTS[k]),
        vertical: spreads.get(c.id)!,
      };
    }),
    totalFinds: data.finds.length,
    spreadCaution: { threshold: spreadThreshold, isDefault: spreadThreshold === DEFAULT_LEVEL_SPREAD_CAUTION },
    depth: depthSummary(data),
    warnings: await stratWarningsFor(db, siteId, data),
    defaults: { ...DEFAULT_PARAMS, rmax: roundMetres(defaultRmax(data.window)) },
    minPoints: MIN_POINTS,
    fingerprint: data.fingerprint,
  };
}
