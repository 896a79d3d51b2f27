import "server-only";
import { trenchDepths } from "./trench-depth";
import { and, asc, count, eq, sql } from "drizzle-orm";
import type { Db } from "@/db/client";
import { contexts, finds, memberships, sites, trenches, users, analysisRuns, type Role } from "@/db/schema";
import type { SiteCreate, SiteUpdate } from "@/lib/schemas/site";
import { recordAudit } from "./audit";
import { conflict, notFound } from "./errors";
import { assertFieldRights } from "./field-rights";
import type { SiteActor } from "./membership";
import { written } from "./written";
import { countSamples } from "./samples";

/** The sites a user belongs to, with their role and what awaits them there. */
export async function listMySites(db: Db, userId: string) {
  const rows = await db
    .select({
      id: sites.id,
      code: sites.code,
      name: sites.name,
      role: memberships.role,
      trenches: sql<number>`(select count(*)::int from ${trenches} where ${trenches.siteId} = ${sites.id})`,
      finds: sql<number>`(select count(*)::int from ${finds} where ${finds.siteId} = ${sites.id})`,
      awaitingSignOff: sql<number>`(select count(*)::int from ${contexts} where ${contexts.siteId} = ${sites.id} and ${contexts.state} = 'awaiting')`,
      runsDone: sql<number>`(select count(*)::int from ${analysisRuns} where ${analysisRuns.siteId} = ${sites.id} and ${analysisRuns.status} = 'done')`,
    })
    .from(memberships)
    .innerJoin(sites, eq(sites.id, memberships.siteId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(sites.code));
  return rows;
}

export async function createSite(db: Db, userId: string, input: SiteCreate) {
  return db.transaction(async (tx) => {
    const [taken] = await tx
      .select({ id: sites.id })
      .from(sites)
      .where(sql`lower(${sites.code}) = lower(${input.code})`);
    if (taken) throw conflict(`The site code ${input.code} is already in use; choose another.`);
    const site = written(
      await tx
        .insert(sites)
        .values({ ...input, crs: input.crs ?? null })
        .returning(),
      "The site",
    );
    await tx.insert(memberships).values({ siteId: site.id, userId, role: "director" });
    await recordAudit(tx, {
      siteId: site.id,
      actorId: userId,
      action: "create",
      recordType: "site",
      recordId: site.id,
      after: site,
    });
    return site;
  });
}

export async function updateSite(db: Db, actor: SiteActor, input: SiteUpdate) {
  assertFieldRights("site", actor.role, input);
  // An update that names no field changes nothing (and writes no audit entry).
  if (!Object.keys(input).length) return actor.site;
  return db.transaction(async (tx) => {
    const [current] = await tx.select().from(sites).where(eq(sites.id, actor.site.id)).for("update");
    if (
      input.samplesShareFindNumbers !== undefined &&
      input.samplesShareFindNumbers !== current?.samplesShareFindNumbers
    ) {
      const n = await countSamples(tx, actor.site.id);
      if (n > 0)
        throw conflict(
          `Sample numbering is fixed once samples are recorded: this site has ${n === 1 ? "1 sample" : `${n} samples`} numbered ${current?.samplesShareFindNumbers ? "in the finds' sequence" : "in their own sequence"}.`,
        );
    }
    const [after] = await tx.update(sites).set(input).where(eq(sites.id, actor.site.id)).returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "site",
      recordId: actor.site.id,
      before: actor.site,
      after,
    });
    return after;
  });
}

/** Per-trench counts, grouped in the database (one query each, not one per trench). */
async function countsByTrench(db: Db, siteId: string) {
  const [ctxCounts, findCounts] = await Promise.all([
    db
      .select({ trenchId: contexts.trenchId, n: count() })
      .from(contexts)
      .where(eq(contexts.siteId, siteId))
      .groupBy(contexts.trenchId),
    db
      .select({ trenchId: finds.trenchId, n: count() })
      .from(finds)
      .where(eq(finds.siteId, siteId))
      .groupBy(finds.trenchId),
  ]);
  return {
    contexts: new Map(ctxCounts.map((r) => [r.trenchId, r.n])),
    finds: new Map(findCounts.map((r) => [r.trenchId, r.n])),
  };
}

export async function siteOverview(db: Db, actor: SiteActor) {
  const [rows, counts, awaiting, depths] = await Promise.all([
    db
      .select({ id: trenches.id, code: trenches.code, name: trenches.name, signedOffAt: trenches.signedOffAt })
      .from(trenches)
      .where(eq(trenches.siteId, actor.site.id))
      .orderBy(asc(trenches.code)),
    countsByTrench(db, actor.site.id),
    db
      .select({ n: count() })
      .from(contexts)
      .where(and(eq(contexts.siteId, actor.site.id), eq(contexts.state, "awaiting"))),
    trenchDepths(db, actor.site.id),
  ]);
  const trenchRows = rows.map((t) => ({
    ...t,
    depth: depths.get(t.id)?.depth ?? null,
    contexts: counts.contexts.get(t.id) ?? 0,
    finds: counts.finds.get(t.id) ?? 0,
  }));
  return { site: actor.site, role: actor.role, trenches: trenchRows, awaitingSignOff: awaiting[0]?.n ?? 0 };
}

export async function listMembers(db: Db, siteId: string) {
  return db
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      role: memberships.role,
      since: memberships.createdAt,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.siteId, siteId))
    .orderBy(asc(users.name));
}

async function assertNotLastDirector(db: Db, siteId: string, userId: string) {
  const rows = await db
    .select({ userId: memberships.userId })
    .from(memberships)
    .where(and(eq(memberships.siteId, siteId), eq(memberships.role, "director")));
  if (rows.length === 1 && rows.every((r) => r.userId === userId)) {
    throw conflict("A site needs at least one director; make someone else director first.");
  }
}

export async function changeMemberRole(db: Db, actor: SiteActor, userId: string, role: Role) {
  assertFieldRights("member", actor.role, { role });
  return db.transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(memberships)
      .where(and(eq(memberships.siteId, actor.site.id), eq(memberships.userId, userId)));
    if (!before) throw notFound("That member");
    if (before.role === "director" && role !== "director")
      await assertNotLastDirector(tx as unknown as Db, actor.site.id, userId);
    const [after] = await tx
      .update(memberships)
      .set({ role })
      .where(and(eq(memberships.siteId, actor.site.id), eq(memberships.userId, userId)))
      .returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "change-role",
      recordType: "member",
      recordId: userId,
      before,
      after,
    });
    return after;
  });
}

export async function removeMember(db: Db, actor: SiteActor, userId: string) {
  return db.transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(memberships)
      .where(and(eq(memberships.siteId, actor.site.id), eq(memberships.userId, userId)));
    if (!before) throw notFound("That member");
    if (before.role === "director") await assertNotLastDirector(tx as unknown as Db, actor.site.id, userId);
    await tx.delete(memberships).where(and(eq(memberships.siteId, actor.site.id), eq(memberships.userId, userId)));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "remove",
      recordType: "member",
      recordId: userId,
      before,
    });
    return { removed: userId };
  });
}
