import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { contexts, findSections, type FindSection, type Site, type Trench } from "@/db/schema";
import { buildSectionFigure, sectionSvg, type ContextLevels, type SectionFigure } from "@/lib/levels/section-figure";
import type { SectionCreate } from "@/lib/schemas/section";
import { recordAudit } from "./audit";
import { conflict, notFound } from "./errors";
import { allFinds } from "./finds";
import { contextRanges } from "./import/lookups";
import type { SiteActor } from "./membership";
import { getTrench } from "./trenches";

export async function listSections(db: Db | Tx, siteId: string, trenchId: string): Promise<FindSection[]> {
  return db
    .select()
    .from(findSections)
    .where(and(eq(findSections.siteId, siteId), eq(findSections.trenchId, trenchId)))
    .orderBy(asc(findSections.name));
}

export async function getSection(
  db: Db | Tx,
  siteId: string,
  trenchId: string,
  sectionId: string,
): Promise<FindSection> {
  const [row] = await db
    .select()
    .from(findSections)
    .where(and(eq(findSections.siteId, siteId), eq(findSections.trenchId, trenchId), eq(findSections.id, sectionId)));
  if (!row) throw notFound("That section");
  return row;
}

/** Saves a section line on a trench. A drawing of finds already recorded: it changes no find or context. */
export async function createSection(db: Db, actor: SiteActor, trenchId: string, input: SectionCreate) {
  return db.transaction(async (tx) => {
    const trench = await getTrench(tx, actor.site.id, trenchId);
    const [taken] = await tx
      .select({ id: findSections.id })
      .from(findSections)
      .where(and(eq(findSections.trenchId, trench.id), eq(findSections.name, input.name)));
    if (taken) throw conflict(`Trench ${trench.code} already has a section named ${input.name}.`);
    const [row] = await tx
      .insert(findSections)
      .values({ ...input, siteId: actor.site.id, trenchId: trench.id, createdBy: actor.userId })
      .returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "section",
      recordId: row!.id,
      after: row,
    });
    return row!;
  });
}

/** Any member deletes a section: it is a drawing, and the audit keeps the whole row it removed. */
export async function deleteSection(db: Db, actor: SiteActor, trenchId: string, sectionId: string) {
  return db.transaction(async (tx) => {
    const row = await getSection(tx, actor.site.id, trenchId, sectionId);
    await tx.delete(findSections).where(eq(findSections.id, row.id));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "section",
      recordId: row.id,
      before: row,
    });
    return { deleted: row.id, name: row.name };
  });
}

/**
 * The top and base of each context of a trench, as far as levels say: the highest top and the lowest base
 * among the spot levels taken on them and the levels of their spits. A context with none has nulls.
 */
export async function trenchContextLevels(db: Db | Tx, siteId: string, trenchId: string): Promise<ContextLevels[]> {
  const ranges = await contextRanges(db, siteId);
  const rows = await db
    .select({ id: contexts.id, number: contexts.number })
    .from(contexts)
    .where(and(eq(contexts.siteId, siteId), eq(contexts.trenchId, trenchId)))
    .orderBy(asc(contexts.number));
  return rows.map((c) => ({
    number: c.number,
    top: ranges.get(c.id)?.top ?? null,
    base: ranges.get(c.id)?.base ?? null,
  }));
}

/** The finds of a trench as a section reads them (position, level, context, class face). */
export async function sectionFinds(db: Db, siteId: string, trenchId: string) {
  const rows = await allFinds(db, siteId, { trenchId, sort: "number", dir: "asc" });
  return rows.map((r) => ({
    number: r.number,
    x: r.x,
    y: r.y,
    z: r.z,
    contextNumber: r.contextNumber,
    classCode: r.classCode,
    colour: r.classColour,
    symbol: r.classSymbol,
  }));
}

export const sectionLine = (s: FindSection) => ({
  start: [s.startX, s.startY] as const,
  end: [s.endX, s.endY] as const,
  halfWidth: s.halfWidth,
});

/** A saved section drawn from the records as they are now. */
export async function sectionFigure(db: Db, site: Site, trench: Trench, section: FindSection): Promise<SectionFigure> {
  const [finds, levels] = await Promise.all([
    sectionFinds(db, site.id, trench.id),
    trenchContextLevels(db, site.id, trench.id),
  ]);
  return buildSectionFigure(section.name, sectionLine(section), section.exaggeration, finds, levels);
}

/** Every saved section of a trench drawn as SVG, for the printed trench record. */
export async function drawTrenchSections(db: Db, site: Site, trench: Trench) {
  const saved = await listSections(db, site.id, trench.id);
  if (saved.length === 0) return [];
  const [finds, levels] = await Promise.all([
    sectionFinds(db, site.id, trench.id),
    trenchContextLevels(db, site.id, trench.id),
  ]);
  return saved.map((s) => {
    const fig = buildSectionFigure(s.name, sectionLine(s), s.exaggeration, finds, levels);
    return {
      id: s.id,
      name: s.name,
      drawn: fig.finds.length,
      withoutLevel: fig.withoutLevel.length,
      svg: sectionSvg(fig, {
        title: `Trench ${trench.code}, section ${s.name}`,
        datumName: site.datumName,
        width: 700,
      }),
    };
  });
}
