import { sendRequest, buildRequest } from "@/lib/api/client";
import { toStored, type RelationReading } from "@/lib/schemas/relation";
import { loopIfAdded, type MatrixContext, type MatrixRelation } from "@/lib/stratigraphy/matrix";
import type { Outbox } from "./outbox";

/**
 * The device's copy of a site's contexts and relations, for the loop check a device runs before it queues
 * a relation (the server runs the same check, lib/stratigraphy/matrix.ts, again when the relation arrives).
 */
const key = (what: "relations" | "contexts", siteId: string) => `${what}:${siteId}`;

export async function cacheSiteMatrix(outbox: Outbox, siteId: string, send = sendRequest): Promise<void> {
  const [relations, contexts, trenches] = await Promise.all([
    send(buildRequest("relationsList", { siteId }, {})) as Promise<MatrixRelation[]>,
    send(buildRequest("contextsList", { siteId }, {})) as Promise<CachedContext[]>,
    send(buildRequest("trenchesList", { siteId })) as Promise<{ id: string; code: string }[]>,
  ]);
  await outbox.setFact(
    `trenches:${siteId}`,
    trenches.map(({ id, code }) => ({ id, code })),
  );
  await outbox.setFact(
    key("relations", siteId),
    relations.filter((r) => "fromId" in r).map(({ id, fromId, toId, kind }) => ({ id, fromId, toId, kind })),
  );
  await outbox.setFact(
    key("contexts", siteId),
    contexts.map(({ id, number, state, trenchId }) => ({ id, number, state, trenchId })),
  );
}

/** A context as the device last read it: enough to offer "move to an open context". */
export type CachedContext = MatrixContext & { state: string; trenchId: string };

export async function cachedTrenches(outbox: Outbox, siteId: string): Promise<{ id: string; code: string }[]> {
  return (await outbox.fact<{ id: string; code: string }[]>(`trenches:${siteId}`)) ?? [];
}

export async function cachedContexts(outbox: Outbox, siteId: string): Promise<CachedContext[]> {
  return (await outbox.fact<CachedContext[]>(key("contexts", siteId))) ?? [];
}

/** The loop the candidate relation would close, named ("1004 above 1007 above 1004"), or null. */
export async function deviceLoopCheck(
  outbox: Outbox,
  siteId: string,
  candidate: Omit<MatrixRelation, "id">,
): Promise<string | null> {
  const relations = [...((await outbox.fact<MatrixRelation[]>(key("relations", siteId))) ?? [])];
  const contexts = [...((await outbox.fact<MatrixContext[]>(key("contexts", siteId))) ?? [])];
  for (const e of await outbox.all()) {
    if (e.siteId !== siteId || !e.body || !e.localId) continue;
    const body = JSON.parse(e.body) as Record<string, unknown>;
    if (e.operation === "contextsCreate") contexts.push({ id: e.localId, number: Number(body.number) });
    if (e.operation === "relationsCreate")
      relations.push({
        id: e.localId,
        ...toStored(String(body.contextId), body.reading as RelationReading, String(body.otherId)),
      });
  }
  const known = new Set(contexts.map((c) => c.id));
  for (const id of [candidate.fromId, candidate.toId]) if (!known.has(id)) contexts.push({ id, number: NaN });
  return loopIfAdded(contexts, relations, { id: "new", ...candidate });
}
