import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { insertContext, insertFindRow, insertMember, insertTrench } from "../../support/rows";
import type { SiteFixture } from "../../support/fixtures";
import { nextCount, type RoleCases } from "./types";
import * as sitesRoute from "@/app/api/sites/route";
import * as siteRoute from "@/app/api/sites/[siteId]/route";
import * as memberRoute from "@/app/api/sites/[siteId]/members/[userId]/route";
import * as classesRoute from "@/app/api/sites/[siteId]/classes/route";
import * as classRoute from "@/app/api/sites/[siteId]/classes/[classId]/route";
import * as trenchesRoute from "@/app/api/sites/[siteId]/trenches/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";
import * as contextsRoute from "@/app/api/sites/[siteId]/contexts/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";

/** For each mutating operation: a fresh target and a valid input, so only the caller decides the outcome. */
export const coreCases: RoleCases = {
  sitesCreate: async () => ({ mod: sitesRoute, params: {}, body: { code: `NEW-${nextCount()}`, name: "New site" } }),
  siteUpdate: async (fx) => ({
    mod: siteRoute,
    params: { siteId: fx.site.id },
    // The name and a setting of analyses by depth: both the director's alone.
    body: { name: `Renamed ${nextCount()}`, levelSpreadCaution: 0.25 },
  }),
  memberUpdate: async (fx) => {
    const u = await insertMember(fx, "Member");
    return { mod: memberRoute, params: { siteId: fx.site.id, userId: u.id }, body: { role: "specialist" } };
  },
  memberRemove: async (fx) => {
    const u = await insertMember(fx, "Leaver");
    return { mod: memberRoute, params: { siteId: fx.site.id, userId: u.id } };
  },
  classesCreate: async (fx) => ({
    mod: classesRoute,
    params: { siteId: fx.site.id },
    body: { code: `C${nextCount()}`, label: "Burnt bone", colour: "#d55e00", symbol: "square" },
  }),
  classUpdate: async (fx) => ({
    mod: classRoute,
    params: { siteId: fx.site.id, classId: fx.cls.id },
    body: { label: `Flint ${nextCount()}` },
  }),
  trenchesCreate: async (fx) => ({
    mod: trenchesRoute,
    params: { siteId: fx.site.id },
    body: {
      code: `B${nextCount()}`,
      outline: {
        type: "Polygon",
        coordinates: [
          [
            [0, 0],
            [4, 0],
            [4, 3],
            [0, 3],
            [0, 0],
          ],
        ],
      },
    },
  }),
  trenchUpdate: async (fx) => ({
    mod: trenchRoute,
    params: { siteId: fx.site.id, trenchId: fx.trench.id },
    body: { name: `North ${nextCount()}` },
  }),
  trenchDelete: async (fx) => {
    const t = await insertTrench(fx, `D${nextCount()}`, [
      [0, 0],
      [1, 0],
      [1, 1],
      [0, 0],
    ]);
    return { mod: trenchRoute, params: { siteId: fx.site.id, trenchId: t.id } };
  },
  contextsCreate: async (fx) => ({
    mod: contextsRoute,
    params: { siteId: fx.site.id },
    body: { trenchId: fx.trench.id, number: 5000 + nextCount(), type: "fill" },
  }),
  contextUpdate: async (fx) => ({
    mod: contextRoute,
    params: { siteId: fx.site.id, contextId: fx.context.id },
    body: { colour: `mid brown ${nextCount()}` },
  }),
  contextDelete: async (fx) => {
    const c = await insertContext(fx, 7000 + nextCount(), "cut");
    return { mod: contextRoute, params: { siteId: fx.site.id, contextId: c.id } };
  },
  findsCreate: async (fx) => ({
    mod: findsRoute,
    params: { siteId: fx.site.id },
    body: { contextId: fx.context.id, classId: fx.cls.id, x: 1.5, y: 1.5 },
  }),
  findUpdate: async (fx) => {
    const f = await insertFind(fx);
    const db = await getDb();
    const [cls] = await db
      .insert(schema.artefactClasses)
      .values({
        siteId: fx.site.id,
        code: `RC${nextCount()}`,
        label: "Retouched flake",
        colour: "#cc79a7",
        symbol: "star",
      })
      .returning();
    // Re-classing: the one change every role on the route may make (field rights are tested in field-rights.test.ts).
    return { mod: findRoute, params: { siteId: fx.site.id, findId: f.id }, body: { classId: cls.id } };
  },
  findDelete: async (fx) => {
    const f = await insertFind(fx);
    return { mod: findRoute, params: { siteId: fx.site.id, findId: f.id } };
  },
};

/** A find in the fixture's context, numbered clear of the ones the routes give. */
export const insertFind = (fx: SiteFixture) => insertFindRow(fx, 90000 + nextCount());
