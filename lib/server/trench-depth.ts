import "server-only";
import { sql } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";

export type TrenchDepth = { surfaceLevel: number | null; lowestLevel: number | null; depth: number | null };

/**
 * How deep each trench of a site is, from its reduced levels: the ground-surface level minus the lowest level
 * recorded in it (finds, spot levels on its contexts, spits and its own runs' points, spit bases). No surface
 * level or no level at all gives no depth — never 0. Drives the deep-trench caution.
 */
export async function trenchDepths(db: Db | Tx, siteId: string): Promise<Map<string, TrenchDepth>> {
  type Row = { id: string; surface: number | string | null; lowest: number | string | null };
  const result = await db.execute(sql`
    with levels as (
      select f.trench_id, f.z as level from finds f where f.site_id = ${siteId} and f.z is not null
      union all
      select c.trench_id, s.level from spot_levels s join contexts c on c.id = s.target_id
        where s.site_id = ${siteId} and s.target in ('context_top', 'context_base')
      union all
      select c.trench_id, s.level from spot_levels s join spits p on p.id = s.target_id join contexts c on c.id = p.context_id
        where s.site_id = ${siteId} and s.target in ('spit_top', 'spit_base')
      union all
      select r.trench_id, s.level from spot_levels s join level_runs r on r.id = s.run_id
        where s.site_id = ${siteId} and s.target in ('ground', 'other') and r.trench_id is not null
      union all
      select c.trench_id, p.base_level from spits p join contexts c on c.id = p.context_id
        where p.site_id = ${siteId} and p.base_level is not null
    )
    select t.id, t.surface_level as surface, min(l.level) as lowest
    from trenches t left join levels l on l.trench_id = t.id
    where t.site_id = ${siteId}
    group by t.id, t.surface_level`);
  // PGlite and node-postgres both answer with { rows }.
  const rows = (result as unknown as { rows: Row[] }).rows;
  return new Map(
    rows.map((r) => {
      const surface = r.surface === null ? null : Number(r.surface);
      const lowest = r.lowest === null ? null : Number(r.lowest);
      const depth =
        surface !== null && lowest !== null ? Math.max(0, Math.round((surface - lowest) * 1000) / 1000) : null;
      return [r.id, { surfaceLevel: surface, lowestLevel: lowest, depth }];
    }),
  );
}

/** One trench's depth from its reduced levels (see trenchDepths). */
export async function trenchDepth(db: Db | Tx, siteId: string, trenchId: string): Promise<TrenchDepth> {
  return (await trenchDepths(db, siteId)).get(trenchId) ?? { surfaceLevel: null, lowestLevel: null, depth: null };
}
