import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import type { SiteFixture } from "../../support/fixtures";
import { nextCount, type RoleCases } from "./types";
import * as submitRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/submit/route";
import * as lockRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/lock/route";
import * as reopenRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/reopen/route";
import * as invitationsRoute from "@/app/api/sites/[siteId]/invitations/route";
import * as invitationRoute from "@/app/api/sites/[siteId]/invitations/[invitationId]/route";

/**
 * Fills every sheet field a layer needs for sign-off (the fixture's context is the site's first, so needs no relation).
 */
export async function completeSheet(contextId: string) {
  const db = await getDb();
  const [c] = await db
    .update(schema.contexts)
    .set({
      colour: "mid brown",
      compaction: "firm",
      composition: "silty clay",
      description: "Layer across the trench.",
      interpretation: "Colluvium.",
    })
    .where(eq(schema.contexts.id, contextId))
    .returning();
  return c;
}

/**
 * Puts a context straight into a state, as if submitted/signed off by `by` at `at` (arranging a test, not the rule).
 */
export async function putInState(
  contextId: string,
  state: schema.Context["state"],
  by: string | null,
  at = new Date("2026-07-14T09:30:00Z"),
) {
  const db = await getDb();
  const [c] = await db
    .update(schema.contexts)
    .set({
      state,
      submittedAt: state === "open" ? null : at,
      submittedBy: state === "open" ? null : by,
      signedOffAt: state === "signed_off" ? at : null,
      signedOffBy: state === "signed_off" ? by : null,
    })
    .where(eq(schema.contexts.id, contextId))
    .returning();
  return c;
}

export const signOffCases: RoleCases = {
  contextSubmit: async (fx: SiteFixture) => {
    await completeSheet(fx.context.id);
    return { mod: submitRoute, params: { siteId: fx.site.id, contextId: fx.context.id } };
  },
  contextSignOff: async (fx) => {
    await completeSheet(fx.context.id);
    await putInState(fx.context.id, "awaiting", fx.people.digger.id);
    return { mod: lockRoute, params: { siteId: fx.site.id, contextId: fx.context.id } };
  },
  contextReopen: async (fx) => {
    await completeSheet(fx.context.id);
    await putInState(fx.context.id, "signed_off", fx.people.director.id);
    return {
      mod: reopenRoute,
      params: { siteId: fx.site.id, contextId: fx.context.id },
      body: { reason: "The finds of the north half were double-counted." },
    };
  },
  invitationsCreate: async (fx) => ({
    mod: invitationsRoute,
    params: { siteId: fx.site.id },
    body: { email: `new.person.${nextCount()}@test.invalid`, role: "digger" },
  }),
  invitationRevoke: async (fx) => {
    const db = await getDb();
    const [inv] = await db
      .insert(schema.invitations)
      .values({
        siteId: fx.site.id,
        email: `pending.${nextCount()}@test.invalid`,
        role: "digger",
        tokenHash: `hash-${nextCount()}-${Math.random()}`,
        invitedBy: fx.people.director.id,
        expiresAt: new Date(Date.now() + 86400_000),
      })
      .returning();
    return { mod: invitationRoute, params: { siteId: fx.site.id, invitationId: inv.id } };
  },
};
