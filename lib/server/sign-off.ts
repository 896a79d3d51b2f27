import "server-only";
import { createHash } from "node:crypto";
import { and, asc, eq, ne, or, sql } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { alias } from "drizzle-orm/pg-core";
import { contextRelations, contexts, finds, trenches, users, type Context, type Find, type Trench } from "@/db/schema";
import { checkOutline } from "@/lib/geometry/outline";
import { recordAudit } from "./audit";
import { squareContent } from "./squares";
import { badInput, conflict, notFound } from "./errors";
import type { SiteActor } from "./membership";
import { formatStamp } from "./locks";
import { notifyReopened, notifySignedOff, notifySubmitted } from "./mail/notify-sign-off";
import type { Delivery } from "./mail/transport";
import { getTrench } from "./trenches";
import { nextVersion } from "./versions";
import { written } from "./written";

/**
 * Sign-off of context sheets (product.md "Record states"): a recorder submits a complete sheet, a director
 * signs it off (locks it) or returns/reopens it with a written reason. A trench is signed off when every one
 * of its contexts is. Every step is audited in its transaction; mail goes out after the commit.
 */

/**
 * Sheet fields a context must have filled in before it can be submitted (common practice for single-context
 * sheets). A cut is an interface, not a material: it has no colour, compaction or composition to describe.
 */
export function requiredSheetFields(type: Context["type"]) {
  return type === "cut"
    ? (["description", "interpretation"] as const)
    : (["colour", "compaction", "composition", "description", "interpretation"] as const);
}

export type SheetProblem = { field: string; message: string };

/** Everything that keeps a sheet from being submitted or signed off; empty when it is complete. */
export async function sheetProblems(tx: Db | Tx, context: Context): Promise<SheetProblem[]> {
  const problems: SheetProblem[] = [];
  for (const f of requiredSheetFields(context.type)) {
    if (!context[f].trim()) problems.push({ field: f, message: `The ${f} of the sheet is empty.` });
  }
  const [rel] = await tx
    .select({ id: contextRelations.id })
    .from(contextRelations)
    .where(or(eq(contextRelations.fromId, context.id), eq(contextRelations.toId, context.id)))
    .limit(1);
  if (!rel) {
    // The site's first context (the earliest recorded) has nothing to relate to yet; every later one must.
    const [earlier] = await tx
      .select({ id: contexts.id })
      .from(contexts)
      .where(
        and(
          eq(contexts.siteId, context.siteId),
          ne(contexts.id, context.id),
          sql`(${contexts.createdAt}, ${contexts.number}) < (${context.createdAt.toISOString()}::timestamptz, ${context.number})`,
        ),
      )
      .limit(1);
    if (earlier)
      problems.push({ field: "relations", message: "The sheet has no stratigraphic relation to another context." });
  }
  const [trench] = await tx.select().from(trenches).where(eq(trenches.id, context.trenchId));
  const check = trench ? checkOutline(trench.outline) : null;
  if (!trench || !check?.ok) {
    problems.push({
      field: "finds",
      message: `Trench ${trench?.code ?? "?"} has no valid outline, so its finds cannot be checked.`,
    });
  } else {
    const placed = await tx
      .select({ number: finds.number, x: finds.x, y: finds.y })
      .from(finds)
      .where(eq(finds.contextId, context.id));
    const outside = placed.filter((f) => !check.window.contains(f.x, f.y)).map((f) => f.number);
    if (outside.length)
      problems.push({
        field: "finds",
        message: `Find${outside.length > 1 ? "s" : ""} ${outside.slice(0, 10).join(", ")}${outside.length > 10 ? ", …" : ""} lie outside trench ${trench.code}.`,
      });
  }
  return problems;
}

function refuseIncomplete(context: Context, problems: SheetProblem[]): never {
  const fieldErrors: Record<string, string[]> = {};
  for (const p of problems) (fieldErrors[p.field] ??= []).push(p.message);
  throw badInput(
    `Context ${context.number} is not complete yet: ${problems.map((p) => p.message).join(" ")}`,
    fieldErrors,
    { problems },
  );
}

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function lockedContext(tx: Tx, siteId: string, contextId: string): Promise<Context> {
  if (!uuidPattern.test(contextId)) throw notFound("That context");
  const [row] = await tx
    .select()
    .from(contexts)
    .where(and(eq(contexts.siteId, siteId), eq(contexts.id, contextId)))
    .for("update");
  if (!row) throw notFound("That context");
  return row;
}

const stateWords = { open: "open", awaiting: "awaiting sign-off", signed_off: "signed off" } as const;

function wrongState(c: Context, doing: string): never {
  const by =
    c.state === "signed_off"
      ? ` on ${formatStamp(c.signedOffAt)}`
      : c.state === "awaiting"
        ? ` since ${formatStamp(c.submittedAt)}`
        : "";
  throw conflict(`Context ${c.number} is ${stateWords[c.state]}${by}, so it cannot be ${doing}.`, { state: c.state });
}

export type SignOffOutcome = { context: Context; trench?: Trench; trenchSignedOff?: boolean; mail: Delivery };

/** open → awaiting: the recorder hands a complete sheet to the directors. */
export async function submitContext(db: Db, actor: SiteActor, contextId: string): Promise<SignOffOutcome> {
  const context = await db.transaction(async (tx) => {
    const before = await lockedContext(tx, actor.site.id, contextId);
    if (before.state !== "open") wrongState(before, "submitted");
    const problems = await sheetProblems(tx, before);
    if (problems.length) refuseIncomplete(before, problems);
    const after = written(
      await tx
        .update(contexts)
        .set({
          state: "awaiting",
          submittedAt: new Date(),
          submittedBy: actor.userId,
          updatedAt: new Date(),
          version: nextVersion(contexts.version),
        })
        .where(eq(contexts.id, contextId))
        .returning(),
      "The submitted context",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "submit",
      recordType: "context",
      recordId: contextId,
      before,
      after,
    });
    return after;
  });
  return { context, mail: await notifySubmitted(db, actor, context) };
}

/** awaiting → signed off (director). Signs off the trench too when this was its last open context. */
export async function signOffContext(db: Db, actor: SiteActor, contextId: string): Promise<SignOffOutcome> {
  const out = await db.transaction(async (tx) => {
    const before = await lockedContext(tx, actor.site.id, contextId);
    if (before.state !== "awaiting")
      wrongState(before, before.state === "open" ? "signed off before it is submitted" : "signed off again");
    const problems = await sheetProblems(tx, before);
    if (problems.length) refuseIncomplete(before, problems);
    const now = new Date();
    const after = written(
      await tx
        .update(contexts)
        .set({
          state: "signed_off",
          signedOffAt: now,
          signedOffBy: actor.userId,
          updatedAt: now,
          version: nextVersion(contexts.version),
        })
        .where(eq(contexts.id, contextId))
        .returning(),
      "The signed-off context",
    );
    const fingerprint = await contextFingerprint(tx, after);
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "sign-off",
      recordType: "context",
      recordId: contextId,
      before,
      after: { ...after, fingerprint },
    });
    const [stillOpen] = await tx
      .select({ id: contexts.id })
      .from(contexts)
      .where(and(eq(contexts.trenchId, after.trenchId), ne(contexts.state, "signed_off")))
      .limit(1);
    let trench: Trench | undefined;
    if (!stillOpen) {
      const t0 = await getTrench(tx, actor.site.id, after.trenchId, { forUpdate: true });
      trench = written(
        await tx
          .update(trenches)
          .set({ signedOffAt: now, signedOffBy: actor.userId, updatedAt: now, version: nextVersion(trenches.version) })
          .where(eq(trenches.id, t0.id))
          .returning(),
        "The signed-off trench",
      );
      const trenchPrint = await trenchFingerprint(tx, trench);
      await recordAudit(tx, {
        siteId: actor.site.id,
        actorId: actor.userId,
        action: "sign-off",
        recordType: "trench",
        recordId: trench.id,
        before: t0,
        after: { ...trench, fingerprint: trenchPrint },
      });
    }
    return { context: after, trench };
  });
  return { ...out, trenchSignedOff: !!out.trench, mail: await notifySignedOff(db, actor, out.context, !!out.trench) };
}

/** awaiting or signed off → open (director, with a written reason). A signed-off trench is reopened with it. */
export async function reopenContext(
  db: Db,
  actor: SiteActor,
  contextId: string,
  reason: string,
): Promise<SignOffOutcome> {
  const text = reason.trim();
  if (text.length < 10)
    throw badInput("Give the reason for reopening in a sentence (at least 10 characters).", {
      reason: ["Write the reason for reopening."],
    });
  const out = await db.transaction(async (tx) => {
    const before = await lockedContext(tx, actor.site.id, contextId);
    if (before.state === "open") wrongState(before, "reopened");
    const now = new Date();
    const after = written(
      await tx
        .update(contexts)
        .set({
          state: "open",
          submittedAt: null,
          submittedBy: null,
          signedOffAt: null,
          signedOffBy: null,
          updatedAt: now,
          version: nextVersion(contexts.version),
        })
        .where(eq(contexts.id, contextId))
        .returning(),
      "The reopened context",
    );
    const action = before.state === "signed_off" ? "reopen" : "return";
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action,
      recordType: "context",
      recordId: contextId,
      before,
      after,
      reason: text,
    });
    const t0 = await getTrench(tx, actor.site.id, after.trenchId, { forUpdate: true });
    if (t0.signedOffAt) {
      const [t1] = await tx
        .update(trenches)
        .set({ signedOffAt: null, signedOffBy: null, updatedAt: now, version: nextVersion(trenches.version) })
        .where(eq(trenches.id, t0.id))
        .returning();
      await recordAudit(tx, {
        siteId: actor.site.id,
        actorId: actor.userId,
        action: "reopen",
        recordType: "trench",
        recordId: t0.id,
        before: t0,
        after: t1,
        reason: `Context ${after.number} reopened: ${text}`,
      });
    }
    return { context: after, from: before.state as "awaiting" | "signed_off", at: now };
  });
  return {
    context: out.context,
    mail: await notifyReopened(db, actor, out.context, { from: out.from, reason: text, at: out.at }),
  };
}

// ——— Fingerprints: SHA-256 of the records' content, stable across sign-off (lifecycle fields left out). ———

/** JSON with object keys sorted at every depth, so equal content always hashes alike. */
export function canonicalJson(value: unknown): string {
  if (value instanceof Date) return JSON.stringify(value.toISOString());
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  if (value && typeof value === "object") {
    const o = value as Record<string, unknown>;
    return `{${Object.keys(o)
      .filter((k) => o[k] !== undefined)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${canonicalJson(o[k])}`)
      .join(",")}}`;
  }
  return JSON.stringify(value ?? null);
}

export function sha256Hex(text: string): string {
  return createHash("sha256").update(text).digest("hex");
}

const sheetContent = ({
  state: _s,
  submittedAt: _a,
  submittedBy: _b,
  signedOffAt: _c,
  signedOffBy: _d,
  updatedAt: _u,
  version: _v,
  ...rest
}: Context) => rest;
// The version counts edits (and sign-off); it is bookkeeping, not content.
const findContent = ({ updatedAt: _u, version: _v, ...rest }: Find) => rest;

/** The records a trench's report shows, in a fixed order, with only the fields that carry content. */
export async function trenchRecordSet(tx: Db | Tx, trench: Trench) {
  const cs = await tx.select().from(contexts).where(eq(contexts.trenchId, trench.id)).orderBy(asc(contexts.number));
  const ids = new Set(cs.map((c) => c.id));
  const rels = (
    await tx
      .select()
      .from(contextRelations)
      .where(eq(contextRelations.siteId, trench.siteId))
      .orderBy(asc(contextRelations.id))
  ).filter((r) => ids.has(r.fromId) || ids.has(r.toId));
  const fs = await tx.select().from(finds).where(eq(finds.trenchId, trench.id)).orderBy(asc(finds.number));
  return { trench, contexts: cs, relations: rels, finds: fs };
}

export async function trenchFingerprint(tx: Db | Tx, trench: Trench): Promise<string> {
  const set = await trenchRecordSet(tx, trench);
  const squares = await squareContent(tx, { trenchId: trench.id });
  return sha256Hex(
    canonicalJson({
      trench: { id: trench.id, code: trench.code, name: trench.name, outline: trench.outline },
      contexts: set.contexts.map(sheetContent),
      relations: set.relations.map((r) => ({ fromId: r.fromId, toId: r.toId, kind: r.kind })),
      finds: set.finds.map(findContent),
      ...(squares.length && { squares }),
    }),
  );
}

export async function contextFingerprint(tx: Db | Tx, context: Context): Promise<string> {
  const rels = await tx
    .select()
    .from(contextRelations)
    .where(or(eq(contextRelations.fromId, context.id), eq(contextRelations.toId, context.id)))
    .orderBy(asc(contextRelations.id));
  const fs = await tx.select().from(finds).where(eq(finds.contextId, context.id)).orderBy(asc(finds.number));
  const squares = await squareContent(tx, { contextId: context.id });
  return sha256Hex(
    canonicalJson({
      context: sheetContent(context),
      relations: rels.map((r) => ({ fromId: r.fromId, toId: r.toId, kind: r.kind })),
      finds: fs.map(findContent),
      ...(squares.length && { squares }),
    }),
  );
}

// ——— The director's queue ———

/** Every context of the site with its state, who submitted/signed it, its finds, and what keeps it from sign-off. */
export async function listSignOffQueue(db: Db, siteId: string) {
  const submitter = alias(users, "submitter");
  const signer = alias(users, "signer");
  const rows = await db
    .select({
      context: contexts,
      trenchCode: trenches.code,
      submittedByName: submitter.name,
      signedOffByName: signer.name,
      finds: sql<number>`(select count(*)::int from ${finds} where ${finds.contextId} = ${contexts.id})`,
    })
    .from(contexts)
    .innerJoin(trenches, eq(trenches.id, contexts.trenchId))
    .leftJoin(submitter, eq(submitter.id, contexts.submittedBy))
    .leftJoin(signer, eq(signer.id, contexts.signedOffBy))
    .where(eq(contexts.siteId, siteId))
    .orderBy(asc(trenches.code), asc(contexts.number));
  const out = [];
  for (const r of rows) {
    const c = r.context;
    out.push({
      id: c.id,
      number: c.number,
      type: c.type,
      state: c.state,
      trenchId: c.trenchId,
      trenchCode: r.trenchCode,
      finds: r.finds,
      submittedAt: c.submittedAt,
      submittedBy: r.submittedByName,
      signedOffAt: c.signedOffAt,
      signedOffBy: r.signedOffByName,
      problems: c.state === "signed_off" ? [] : await sheetProblems(db, c),
    });
  }
  const trenchRows = await db
    .select({ id: trenches.id, code: trenches.code, signedOffAt: trenches.signedOffAt, signedOffBy: signer.name })
    .from(trenches)
    .leftJoin(signer, eq(signer.id, trenches.signedOffBy))
    .where(eq(trenches.siteId, siteId))
    .orderBy(asc(trenches.code));
  return { contexts: out, trenches: trenchRows };
}
