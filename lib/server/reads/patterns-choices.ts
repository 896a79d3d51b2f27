import "server-only";
import { asc, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { contexts, spits, trenches } from "@/db/schema";
import { listClassLooks } from "../artefact-classes";

/** What the Patterns workspace offers to choose from: the site's trenches, contexts, their spits and find classes. */
export async function patternsChoices(db: Db, siteId: string) {
  const [trenchRows, contextRows, classRows, spitRows] = await Promise.all([
    db
      .select({ id: trenches.id, code: trenches.code, name: trenches.name })
      .from(trenches)
      .where(eq(trenches.siteId, siteId))
      .orderBy(asc(trenches.code)),
    db
      .select({
        id: contexts.id,
        trenchId: contexts.trenchId,
        number: contexts.number,
        type: contexts.type,
        state: contexts.state,
        interpretation: contexts.interpretation,
      })
      .from(contexts)
      .where(eq(contexts.siteId, siteId))
      .orderBy(asc(contexts.number)),
    listClassLooks(db, siteId),
    db
      .select({
        id: spits.id,
        contextId: spits.contextId,
        number: spits.number,
        topLevel: spits.topLevel,
        baseLevel: spits.baseLevel,
      })
      .from(spits)
      .where(eq(spits.siteId, siteId))
      .orderBy(asc(spits.number)),
  ]);
  return { trenches: trenchRows, contexts: contextRows, classes: classRows, spits: spitRows };
}
