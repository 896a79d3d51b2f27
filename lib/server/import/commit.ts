import "server-only";
import { randomUUID } from "node:crypto";
import type { Db, Tx } from "@/db/client";
import { sql } from "drizzle-orm";
import {
  importFields,
  type ImportCommitInput,
  type ImportMapping,
  type ImportPreviewInput,
} from "@/lib/schemas/import";
import { recordAudit } from "@/lib/server/audit";
import { getContext } from "@/lib/server/contexts";
import { badInput } from "@/lib/server/errors";
import { allocateFindNumbers, lockSiteNumbers, reserveFindNumbersThrough } from "@/lib/server/find-numbers";
import { assertContextWritable } from "@/lib/server/locks";
import type { SiteActor } from "@/lib/server/membership";
import { guessMapping } from "./guess";
import { loadImportLookups } from "./lookups";
import { getImportMapping, saveImportMapping } from "./mapping-store";
import { parseCsv, type ParsedCsv } from "./parse";
import { validateRows, type ValidRow } from "./validate";

const required = ["x", "y", "classCode", "contextNumber"] as const;
/** Rows per INSERT statement; each statement carries its rows as one JSON parameter. */
const BATCH = 10_000;

function missingHeaders(csv: ParsedCsv, mapping: Partial<ImportMapping>): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const f of required) if (!mapping[f]) out[`mapping.${f}`] = ["Pick the column that holds this."];
  for (const f of importFields) {
    const h = mapping[f];
    if (h && !csv.headers.includes(h)) out[`mapping.${f}`] = [`The file has no column "${h}".`];
  }
  return out;
}

/** Reads the file, settles the mapping (given, remembered or guessed) and checks every row; imports nothing. */
export async function previewImport(db: Db, actor: SiteActor, input: ImportPreviewInput) {
  const csv = parseCsv(input.csv);
  const remembered = await getImportMapping(db, actor.site.id);
  const mapping: Partial<ImportMapping> = input.mapping ?? remembered ?? guessMapping(csv.headers);
  const source: "given" | "remembered" | "guessed" = input.mapping ? "given" : remembered ? "remembered" : "guessed";
  const problems = missingHeaders(csv, mapping);
  const base = {
    headers: csv.headers,
    mapping,
    mappingSource: source,
    rowCount: csv.rows.length,
    sample: csv.rows.slice(0, 10),
  };
  if (Object.keys(problems).length)
    return { ...base, mappingProblems: problems, errors: [], warnings: [], validCount: 0 };
  const full = mapping as ImportMapping;
  if (input.mapping) await db.transaction((tx) => saveImportMapping(tx, actor, full));
  const result = validateRows(csv, full, await loadImportLookups(db, actor.site.id), input.zReference);
  return {
    ...base,
    mappingProblems: {},
    errors: result.errors,
    warnings: result.warnings,
    validCount: result.valid.length,
  };
}

/**
 * Imports the whole file in one transaction or nothing at all. Validation runs again inside the
 * transaction with the site's numbering lock held, so what was previewed cannot go stale underneath.
 */
export async function commitImport(db: Db, actor: SiteActor, input: ImportCommitInput) {
  const csv = parseCsv(input.csv);
  const problems = missingHeaders(csv, input.mapping);
  if (Object.keys(problems).length) throw badInput("The column mapping is not complete.", problems);
  if (csv.rows.length === 0) throw badInput("The file has a header but no rows.");
  return db.transaction(async (tx) => {
    await lockSiteNumbers(tx, actor.site.id);
    const result = validateRows(csv, input.mapping, await loadImportLookups(tx, actor.site.id), input.zReference);
    if (result.errors.length) {
      const n = result.errors.length;
      throw badInput(
        `${n} of ${csv.rows.length} rows cannot be imported, so nothing was imported. Fix ${n === 1 ? "it" : "them"} and upload the file again.`,
        undefined,
        { errors: result.errors },
      );
    }
    for (const id of result.contextIds)
      await assertContextWritable(tx, await getContext(tx, actor.site.id, id), "given new finds");
    const numbers = await numberRows(tx, actor.site.id, result.valid);
    const importId = randomUUID();
    for (let i = 0; i < result.valid.length; i += BATCH) {
      await insertBatch(tx, actor, importId, result.valid.slice(i, i + BATCH), numbers.slice(i, i + BATCH));
    }
    const range = numbers.reduce<[number, number]>(
      (m, n) => [Math.min(m[0], n), Math.max(m[1], n)],
      [Infinity, -Infinity],
    );
    // One trail entry for the whole file; each find has its own (insertBatch), naming this import.
    const summary = {
      fileName: input.fileName,
      rows: result.valid.length,
      numbers: range,
      contexts: [...result.contextIds],
      zReference: input.zReference,
      levelWarnings: result.warnings.length,
    };
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "import",
      recordType: "import",
      recordId: importId,
      after: summary,
    });
    await saveImportMapping(tx, actor, input.mapping);
    return {
      imported: result.valid.length,
      firstNumber: range[0],
      lastNumber: range[1],
      importId,
      warnings: result.warnings.length,
    };
  });
}

/** File numbers are kept; blank ones are allocated after the highest, in file order, without gaps. */
async function numberRows(tx: Tx, siteId: string, rows: ValidRow[]): Promise<number[]> {
  let highest = 0;
  for (const r of rows) if (r.number !== null && r.number > highest) highest = r.number;
  if (highest) await reserveFindNumbersThrough(tx, siteId, highest);
  const blanks = rows.filter((r) => r.number === null).length;
  let next = blanks ? await allocateFindNumbers(tx, siteId, blanks) : 0;
  return rows.map((r) => r.number ?? next++);
}

/**
 * Inserts rows through jsonb_to_recordset: one statement and one parameter per batch. Binding 14 parameters
 * per row made PGlite spend most of a 50,000-row import marshalling them (measured about 3× slower). Each
 * new find's trail entry (action "import", the row as created, the import's id) is written by one more
 * set-based statement (keys as in every other find entry), so a find's own trail starts with the file it
 * came from.
 */
async function insertBatch(
  tx: Tx,
  actor: SiteActor,
  importId: string,
  rows: ValidRow[],
  numbers: number[],
): Promise<void> {
  const records = rows.map((r, k) => ({
    id: randomUUID(),
    site_id: actor.site.id,
    trench_id: r.trenchId,
    context_id: r.contextId,
    class_id: r.classId,
    number: numbers[k],
    station_point: r.stationPoint,
    x: r.x,
    y: r.y,
    z: r.z,
    count: r.count,
    weight_g: r.weightG,
    description: r.description,
    recorded_by: actor.userId,
  }));
  await tx.execute(sql`
    insert into finds (id, site_id, trench_id, context_id, class_id, number, station_point, x, y, z, count, weight_g, description, method, recorded_by)
    select id, site_id, trench_id, context_id, class_id, number, station_point, x, y, z, count, weight_g, description, 'imported', recorded_by
    from jsonb_to_recordset(${JSON.stringify(records)}::jsonb) as r(id uuid, site_id uuid, trench_id uuid, context_id uuid, class_id uuid,
      number integer, station_point text, x double precision, y double precision, z double precision, count integer, weight_g double precision, description text, recorded_by uuid)`);
  await tx.execute(sql`
    insert into audit_entries (site_id, actor_id, action, record_type, record_id, after)
    select f.site_id, ${actor.userId}::uuid, 'import', 'find', f.id::text, jsonb_build_object(
      'id', f.id, 'siteId', f.site_id, 'trenchId', f.trench_id, 'contextId', f.context_id, 'classId', f.class_id, 'number', f.number, 'stationPoint', f.station_point,
      'x', f.x, 'y', f.y, 'z', f.z, 'count', f.count, 'weightG', f.weight_g, 'description', f.description, 'method', f.method,
      'recordedBy', f.recorded_by, 'recordedAt', f.recorded_at, 'importId', ${importId}::text)
    from finds f where f.id in (select (e->>'id')::uuid from jsonb_array_elements(${JSON.stringify(records.map((r) => ({ id: r.id })))}::jsonb) as e)`);
}
