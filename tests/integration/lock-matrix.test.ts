import { describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { api, type ApiOperation } from "@/lib/server/api-catalog";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { nextCount, type Prepared } from "./role-cases/types";
import { completeSheet, putInState } from "./role-cases/sign-off";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import * as relationsRoute from "@/app/api/sites/[siteId]/relations/route";
import * as relationRoute from "@/app/api/sites/[siteId]/relations/[relationId]/route";
import * as importRoute from "@/app/api/sites/[siteId]/import/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";
import * as spitsRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/spits/route";
import * as spitRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/spits/[spitId]/route";
import * as levelRunsRoute from "@/app/api/sites/[siteId]/level-runs/route";
import { makeBenchmark, makeSpit } from "./role-cases/levels";
import * as squaresRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/squares/route";
import * as squareRecordRoute from "@/app/api/sites/[siteId]/square-records/[sampleId]/route";
import * as squareImportRoute from "@/app/api/sites/[siteId]/square-import/route";
import { gridTrench, makeSquareRecord, squareCsv } from "./role-cases/squares";
import { makeDrawing, makeRecordPhoto, makeSample } from "./role-cases/archive";
import * as recordPhotoRoute from "@/app/api/sites/[siteId]/record-photos/[photoId]/route";
import * as drawingsRoute from "@/app/api/sites/[siteId]/drawings/route";
import * as drawingRoute from "@/app/api/sites/[siteId]/drawings/[drawingId]/route";
import * as samplesRoute from "@/app/api/sites/[siteId]/samples/route";
import * as sampleRoute from "@/app/api/sites/[siteId]/samples/[sampleId]/route";
import * as findsBulkRoute from "@/app/api/sites/[siteId]/finds/bulk/route";

/**
 * Issue 7 "Tests": every write path that can touch a context's sheet, finds or relations × (open, awaiting,
 * signed off) × every role. The target is always the fixture's context `T`; each case arranges its records
 * while T is open, then T is put in the state under test.
 */
type LockCase = {
  op: keyof typeof api;
  title: string;
  prepare: (fx: SiteFixture) => Promise<Prepared>;
  /** Refused even when open (the write itself is invalid). */
  alwaysRefused?: boolean;
  /**
   * The total-station importer lists every refused row with its reason (issue 5), so a locked context comes
   * back as a 400 row report, each row naming who submitted or signed it off and when, rather than as one 409.
   */
  rowReportWhenLocked?: boolean;
  /** The roles the field rights let change the fields this case names, when narrower than the route's. */
  fieldRoles?: readonly ("digger" | "specialist" | "director")[];
};

const recorderFields = ["digger", "director"] as const;

async function findIn(fx: SiteFixture, contextId: string, x = 1, y = 1) {
  const db = await getDb();
  const [f] = await db
    .insert(schema.finds)
    .values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId,
      classId: fx.cls.id,
      number: 50000 + nextCount(),
      x,
      y,
      method: "plan",
    })
    .returning();
  return f;
}
async function otherContext(fx: SiteFixture) {
  const db = await getDb();
  const [c] = await db
    .insert(schema.contexts)
    .values({ siteId: fx.site.id, trenchId: fx.trench.id, number: 60000 + nextCount(), type: "fill" })
    .returning();
  return c;
}
const site = (fx: SiteFixture) => ({ siteId: fx.site.id });
async function levelRunOn(fx: SiteFixture, target: string, targetId: string): Promise<Prepared> {
  const b = await makeBenchmark(fx);
  const lines = [
    { station: b.code, target: "benchmark", backsight: 1.3 },
    { station: "level", target, targetId, intermediate: 1.6 },
    { station: "CP", target: "change_point", foresight: 1.1 },
  ];
  return { mod: levelRunsRoute, params: site(fx), body: { takenOn: "2026-06-11", startBenchmarkId: b.id, lines } };
}

const cases: LockCase[] = [
  {
    op: "contextUpdate",
    title: "edit the sheet",
    prepare: async (fx) => ({
      mod: contextRoute,
      params: { ...site(fx), contextId: fx.context.id },
      body: { colour: "dark brown" },
    }),
  },
  {
    op: "contextDelete",
    title: "delete the sheet",
    prepare: async (fx) => ({ mod: contextRoute, params: { ...site(fx), contextId: fx.context.id } }),
  },
  {
    op: "findsCreate",
    title: "record a find in T",
    prepare: async (fx) => ({
      mod: findsRoute,
      params: site(fx),
      body: { contextId: fx.context.id, classId: fx.cls.id, x: 1.5, y: 1.5, method: "plan" },
    }),
  },
  {
    op: "findUpdate",
    title: "edit a find of T",
    prepare: async (fx) => ({
      mod: findRoute,
      params: { ...site(fx), findId: (await findIn(fx, fx.context.id)).id },
      body: { description: "retouched" },
    }),
    fieldRoles: recorderFields,
  },
  {
    op: "findUpdate",
    title: "move a find of T on the plan (drag)",
    prepare: async (fx) => ({
      mod: findRoute,
      params: { ...site(fx), findId: (await findIn(fx, fx.context.id)).id },
      body: { x: 2.5, y: 1.25 },
    }),
    fieldRoles: recorderFields,
  },
  {
    op: "findUpdate",
    title: "re-class a find of T",
    prepare: async (fx) => {
      const db = await getDb();
      const [c2] = await db
        .insert(schema.artefactClasses)
        .values({ siteId: fx.site.id, code: `K${nextCount()}`, label: "Chip", colour: "#56b4e9", symbol: "diamond" })
        .returning();
      return {
        mod: findRoute,
        params: { ...site(fx), findId: (await findIn(fx, fx.context.id)).id },
        body: { classId: c2.id },
      };
    },
  },
  {
    op: "findUpdate",
    title: "move a find from T to another context",
    prepare: async (fx) => ({
      mod: findRoute,
      params: { ...site(fx), findId: (await findIn(fx, fx.context.id)).id },
      body: { contextId: (await otherContext(fx)).id },
    }),
    fieldRoles: recorderFields,
  },
  {
    op: "findUpdate",
    title: "move a find from another context into T",
    prepare: async (fx) => {
      const other = await otherContext(fx);
      return {
        mod: findRoute,
        params: { ...site(fx), findId: (await findIn(fx, other.id)).id },
        body: { contextId: fx.context.id },
      };
    },
    fieldRoles: recorderFields,
  },
  {
    op: "findDelete",
    title: "delete a find of T",
    prepare: async (fx) => ({ mod: findRoute, params: { ...site(fx), findId: (await findIn(fx, fx.context.id)).id } }),
  },
  {
    op: "relationsCreate",
    title: "relate another context to T (typed on the other sheet)",
    prepare: async (fx) => ({
      mod: relationsRoute,
      params: site(fx),
      body: { contextId: (await otherContext(fx)).id, reading: "above", otherId: fx.context.id },
    }),
  },
  {
    op: "relationsCreate",
    title: "relate T to another context (typed on T's sheet)",
    prepare: async (fx) => ({
      mod: relationsRoute,
      params: site(fx),
      body: { contextId: fx.context.id, reading: "below", otherId: (await otherContext(fx)).id },
    }),
  },
  {
    op: "relationDelete",
    title: "remove a relation of T",
    prepare: async (fx) => {
      const db = await getDb();
      const [r] = await db
        .insert(schema.contextRelations)
        .values({ siteId: fx.site.id, fromId: (await otherContext(fx)).id, toId: fx.context.id, kind: "above" })
        .returning();
      return { mod: relationRoute, params: { ...site(fx), relationId: r.id } };
    },
  },
  {
    op: "importCommit",
    title: "import total-station rows into T",
    rowReportWhenLocked: true,
    prepare: async (fx) => ({
      mod: importRoute,
      params: site(fx),
      body: {
        csv: `x,y,class,context\n1.5,1.5,${fx.cls.code},${fx.context.number}\n2.5,1.0,${fx.cls.code},${fx.context.number}\n`,
        fileName: "ts.csv",
        mapping: { x: "x", y: "y", classCode: "class", contextNumber: "context" },
      },
    }),
  },
  {
    op: "spitsCreate",
    title: "add a spit to T",
    prepare: async (fx) => ({
      mod: spitsRoute,
      params: { ...site(fx), contextId: fx.context.id },
      body: { number: nextCount(), topLevel: 49.3 },
    }),
  },
  {
    op: "spitUpdate",
    title: "change a spit's levels in T",
    prepare: async (fx) => ({
      mod: spitRoute,
      params: { ...site(fx), contextId: fx.context.id, spitId: (await makeSpit(fx)).id },
      body: { topLevel: 49.31 },
    }),
  },
  {
    op: "spitDelete",
    title: "delete a spit of T",
    prepare: async (fx) => ({
      mod: spitRoute,
      params: { ...site(fx), contextId: fx.context.id, spitId: (await makeSpit(fx)).id },
    }),
  },
  {
    op: "levelRunsCreate",
    title: "level the top of T",
    prepare: async (fx) => levelRunOn(fx, "context_top", fx.context.id),
  },
  {
    op: "levelRunsCreate",
    title: "level a find of T",
    prepare: async (fx) => levelRunOn(fx, "find", (await findIn(fx, fx.context.id)).id),
  },
  {
    op: "levelRunsCreate",
    title: "level a spit boundary of T",
    prepare: async (fx) => levelRunOn(fx, "spit_base", (await makeSpit(fx)).id),
  },
  {
    op: "squareRecord",
    title: "record counts in a square of T",
    prepare: async (fx) => {
      await gridTrench(fx);
      return {
        mod: squaresRoute,
        params: { ...site(fx), trenchId: fx.trench.id },
        body: { col: 1, row: 1, contextId: fx.context.id, counts: [{ classId: fx.cls.id, count: 4 }] },
      };
    },
  },
  {
    op: "squareRecord",
    title: "change the counts of a square of T",
    prepare: async (fx) => {
      await makeSquareRecord(fx, 1, 1);
      return {
        mod: squaresRoute,
        params: { ...site(fx), trenchId: fx.trench.id },
        body: {
          col: 1,
          row: 1,
          contextId: fx.context.id,
          excavatedArea: 0.5,
          counts: [{ classId: fx.cls.id, count: 0 }],
        },
      };
    },
  },
  {
    op: "squareDelete",
    title: "delete a square record of T",
    prepare: async (fx) => ({
      mod: squareRecordRoute,
      params: { ...site(fx), sampleId: (await makeSquareRecord(fx)).id },
    }),
  },
  {
    op: "squareImport",
    title: "import counts by square into T",
    rowReportWhenLocked: true,
    prepare: async (fx) => {
      await gridTrench(fx);
      return { mod: squareImportRoute, params: site(fx), body: { trenchId: fx.trench.id, csv: squareCsv(fx) } };
    },
  },
  {
    op: "findsBulk",
    title: "re-class finds of T in bulk",
    prepare: async (fx) => {
      const db = await getDb();
      const [c2] = await db
        .insert(schema.artefactClasses)
        .values({ siteId: fx.site.id, code: `KB${nextCount()}`, label: "Chip", colour: "#56b4e9", symbol: "diamond" })
        .returning();
      return {
        mod: findsBulkRoute,
        params: site(fx),
        body: {
          action: "reclass",
          findIds: [(await findIn(fx, fx.context.id)).id, (await findIn(fx, fx.context.id)).id],
          classId: c2!.id,
        },
      };
    },
  },
  {
    op: "findsBulk",
    title: "move finds of another context into T in bulk",
    fieldRoles: recorderFields,
    prepare: async (fx) => {
      const other = await otherContext(fx);
      return {
        mod: findsBulkRoute,
        params: site(fx),
        body: { action: "move", findIds: [(await findIn(fx, other.id)).id], contextId: fx.context.id },
      };
    },
  },
  {
    op: "findsBulk",
    title: "move finds of T to another context in bulk",
    fieldRoles: recorderFields,
    prepare: async (fx) => ({
      mod: findsBulkRoute,
      params: site(fx),
      body: { action: "move", findIds: [(await findIn(fx, fx.context.id)).id], contextId: (await otherContext(fx)).id },
    }),
  },
  {
    op: "findsBulk",
    title: "delete finds of T in bulk, with a reason",
    fieldRoles: recorderFields,
    prepare: async (fx) => ({
      mod: findsBulkRoute,
      params: site(fx),
      body: { action: "delete", findIds: [(await findIn(fx, fx.context.id)).id], reason: "entered twice" },
    }),
  },
  {
    op: "samplesCreate",
    title: "take a sample from T",
    prepare: async (fx) => ({
      mod: samplesRoute,
      params: site(fx),
      body: { contextId: fx.context.id, type: "bulk", volumeL: 40 },
    }),
  },
  {
    op: "sampleUpdate",
    title: "change a sample of T",
    prepare: async (fx) => ({
      mod: sampleRoute,
      params: { ...site(fx), sampleId: (await makeSample(fx)).id },
      body: { volumeL: 20 },
    }),
  },
  {
    op: "sampleUpdate",
    title: "move a sample from another context into T",
    prepare: async (fx) => ({
      mod: sampleRoute,
      params: { ...site(fx), sampleId: (await makeSample(fx, (await otherContext(fx)).id)).id },
      body: { contextId: fx.context.id },
    }),
  },
  {
    op: "sampleDelete",
    title: "delete a sample of T",
    prepare: async (fx) => ({
      mod: sampleRoute,
      params: { ...site(fx), sampleId: (await makeSample(fx)).id },
      body: { reason: "entered twice" },
    }),
  },
  {
    op: "drawingsCreate",
    title: "record a drawing showing T",
    prepare: async (fx) => ({
      mod: drawingsRoute,
      params: site(fx),
      body: { kind: "section", scale: 10, contextIds: [(await otherContext(fx)).id, fx.context.id] },
    }),
  },
  {
    op: "drawingUpdate",
    title: "change a drawing showing T",
    prepare: async (fx) => ({
      mod: drawingRoute,
      params: { ...site(fx), drawingId: (await makeDrawing(fx)).id },
      body: { title: "Section through the ditch" },
    }),
  },
  {
    op: "drawingUpdate",
    title: "add T to a drawing of another context",
    prepare: async (fx) => ({
      mod: drawingRoute,
      params: { ...site(fx), drawingId: (await makeDrawing(fx, (await otherContext(fx)).id)).id },
      body: { contextIds: [fx.context.id] },
    }),
  },
  {
    op: "drawingDelete",
    title: "delete a drawing showing T",
    prepare: async (fx) => ({
      mod: drawingRoute,
      params: { ...site(fx), drawingId: (await makeDrawing(fx)).id },
      body: { reason: "entered twice" },
    }),
  },
  {
    op: "recordPhotoUpdate",
    title: "change the caption of a photo of T",
    prepare: async (fx) => ({
      mod: recordPhotoRoute,
      params: { ...site(fx), photoId: (await makeRecordPhoto(fx)).id },
      body: { caption: "Hearth, half-sectioned", facing: "NE" },
    }),
  },
  {
    op: "recordPhotoUpdate",
    title: "change the scale of a photo of a find of T",
    prepare: async (fx) => ({
      mod: recordPhotoRoute,
      params: {
        ...site(fx),
        photoId: (await makeRecordPhoto(fx, { findId: (await findIn(fx, fx.context.id)).id })).id,
      },
      body: { scale: "20 cm" },
    }),
  },
  {
    op: "recordPhotoDelete",
    title: "delete a photo of T",
    prepare: async (fx) => ({
      mod: recordPhotoRoute,
      params: { ...site(fx), photoId: (await makeRecordPhoto(fx)).id },
      body: { reason: "out of focus" },
    }),
  },
  {
    op: "trenchUpdate",
    title: "redraw the outline so a find of T falls outside",
    alwaysRefused: true,
    prepare: async (fx) => {
      await findIn(fx, fx.context.id, 9, 5);
      return {
        mod: trenchRoute,
        params: { ...site(fx), trenchId: fx.trench.id },
        body: {
          outline: {
            type: "Polygon",
            coordinates: [
              [
                [0, 0],
                [8, 0],
                [8, 6],
                [0, 6],
                [0, 0],
              ],
            ],
          },
        },
      };
    },
  },
];

/**
 * Mutating operations that cannot touch a context's sheet, finds or relations, each with the reason. A new
 * operation in the catalogue must be added to `cases` or here, so no write path escapes the lock by omission.
 */
const outsideTheLock: Record<string, string> = {
  sitesCreate: "a new site has no contexts",
  siteUpdate: "site name, grid, numbering and analysis settings only",
  memberUpdate: "membership",
  memberRemove: "membership",
  classesCreate: "a new class has no finds",
  classUpdate: "label/colour/symbol of the vocabulary; finds keep their class",
  trenchesCreate: "a new trench has no contexts",
  trenchDelete: "refused while the trench has contexts",
  contextsCreate: "a new context starts open",
  importPreview: "imports nothing (rows into a locked context are reported, not written)",
  contextSubmit: "the sign-off step itself (sign-off-flow.test.ts)",
  contextSignOff: "the sign-off step itself (sign-off-flow.test.ts)",
  contextReopen: "the sign-off step itself (sign-off-flow.test.ts)",
  invitationsCreate: "membership",
  invitationRevoke: "membership",
  photoFit: "photo underlay and its fit; no find or context changes",
  photoDelete: "photo underlay only",
  runsCreate: "reads records, writes an analysis run",
  runCancel: "analysis run only",
  datumUpdate: "the site's datum name and tolerance; no level changes",
  sectionsCreate: "a drawing of finds already recorded; changes no find or context",
  sectionDelete: "a drawing only; no find or context changes",
  samplesStore: "where samples are kept comes after the trench; the sample's sheet is unchanged (boxes.test.ts)",
  boxesCreate: "a box of the finds store; no find or context changes",
  boxUpdate: "a box's number, store or note; no find or context changes",
  boxDelete: "only an empty box is deleted; no find or context changes (boxes.test.ts)",
  boxEmpty: "where finds and samples are kept comes after the trench; their sheets are unchanged (boxes.test.ts)",
  samplesStatus: "post-excavation processing comes after the trench; the sample's sheet is unchanged (samples.test.ts)",
  numberBlocksCreate: "reserves numbers; records nothing in a context",
  numberBlockRelease: "numbers only; records keep theirs",
  discardsCreate: "an audit entry only; changes no record",
  benchmarksCreate: "a new benchmark",
  benchmarkUpdate: "a benchmark's level is fixed once a run used it",
  benchmarkDelete: "refused once a run used it",
  packagesCreate: "reads records, writes a package file; changes no record",
};

async function snapshot(): Promise<string> {
  const db = await getDb();
  const tables = [
    schema.sites,
    schema.memberships,
    schema.users,
    schema.trenches,
    schema.contexts,
    schema.contextRelations,
    schema.artefactClasses,
    schema.finds,
    schema.importMappings,
    schema.spits,
    schema.spotLevels,
    schema.levelRuns,
    schema.squareSamples,
    schema.squareCounts,
    schema.samples,
    schema.drawings,
    schema.drawingContexts,
    schema.photos,
  ];
  const parts: string[] = [];
  for (const t of tables) parts.push(JSON.stringify(await db.select().from(t)));
  parts.push(String((await db.select().from(schema.auditEntries)).length));
  return parts.join("\n");
}

const states = ["open", "awaiting", "signed_off"] as const;
const roles = ["digger", "specialist", "director"] as const;
const allowed = (op: ApiOperation, role: (typeof roles)[number], c?: LockCase) =>
  (op.roles === "member" || (Array.isArray(op.roles) && op.roles.includes(role))) &&
  (!c?.fieldRoles || c.fieldRoles.includes(role));

describe("lock matrix: every write path × state × role", () => {
  it("classifies every mutating operation of the catalogue", () => {
    const mutating = (Object.entries(api) as [string, ApiOperation][])
      .filter(([, op]) => op.method !== "GET" && !op.public)
      .map(([n]) => n);
    const covered = new Set<string>([...cases.map((c) => c.op), ...Object.keys(outsideTheLock)]);
    const missing = mutating.filter((n) => !covered.has(n));
    expect(
      missing,
      "add these operations to a lock case or to outsideTheLock in tests/integration/lock-matrix.test.ts",
    ).toEqual([]);
  });

  for (const c of cases) {
    const op = api[c.op] as ApiOperation;
    for (const state of states) {
      for (const role of roles) {
        const rowReport = c.rowReportWhenLocked && state !== "open" && allowed(op, role, c);
        const want = !allowed(op, role, c)
          ? 403
          : state === "open" && !c.alwaysRefused
            ? (op.successStatus ?? 200)
            : rowReport
              ? 400
              : 409;
        it(`${c.title} [${op.method} ${op.path}] · ${state} · ${role} → ${want}`, async () => {
          const fx = await makeSite();
          await completeSheet(fx.context.id);
          const prepared = await c.prepare(fx);
          if (state !== "open")
            await putInState(fx.context.id, state, state === "awaiting" ? fx.people.digger.id : fx.people.director.id);
          const before = await snapshot();
          session.userId = fx.people[role].id;
          const res = await call(prepared.mod, op.method, prepared.params, prepared.body, prepared.query);
          expect(res.status, JSON.stringify(res.json)).toBe(want);
          if (want >= 400) {
            expect(await snapshot()).toBe(before);
          } else {
            expect(await snapshot()).not.toBe(before);
          }
          if (rowReport) {
            const reasons = (res.json.details.errors as { reasons: string[] }[]).flatMap((e) => e.reasons);
            expect(reasons.length).toBeGreaterThan(0);
            const holder =
              state === "signed_off"
                ? "was signed off by Director on 2026-07-14"
                : "awaits sign-off (submitted by Digger on 2026-07-14)";
            for (const r of reasons) expect(r).toContain(`context ${fx.context.number} ${holder}`);
          }
          if (want === 409 && state !== "open") {
            // The refusal says who holds the sheet and since when (putInState stamps 14 Jul 2026, 09:30 UTC).
            const who = state === "signed_off" ? "signed off by Director" : "submitted for sign-off by Digger";
            expect(res.json.error).toContain(`Context ${fx.context.number} was ${who} on 14 Jul 2026, 09:30 UTC`);
          }
        });
      }
    }
  }
});
