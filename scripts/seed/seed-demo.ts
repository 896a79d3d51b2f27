import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import * as s from "@/db/schema";
import { hashPassword } from "@/lib/server/passwords";
import { windowToPolygon } from "@/lib/geometry/outline";
import { DEMO_TRENCH } from "@/lib/spatial";
import { DEMO_PLACEMENT } from "./demo-placement";
import { seedDemoLevels } from "./seed-demo-levels";
import { seedDemoSquares } from "./seed-demo-squares";
import { clusteredLayout, createRandom, evenLayout, randomLayout, windowOf, type Pt } from "./demo-layout";

/** The invented demo site. Every name here is made up. */
export const DEMO_SITE_CODE = "WHD26";
import { DEMO_USERS } from "@/lib/demo-users";
export { DEMO_USERS };
export const DEMO_SEED = 20261201;
/** Ground-surface reduced levels of the demo trenches (metres against the site datum; invented). */
export const DEMO_SURFACE = { A: 49.62, B: 49.35, C: 49.81 } as const;

/** Okabe & Ito (2008) colour-blind-safe palette, each class paired with its own symbol shape. */
const CLASSES = [
  { code: "FLK", label: "Flint flake", material: "flint", colour: "#0072b2", symbol: "triangle" },
  { code: "CHP", label: "Knapping chip", material: "flint", colour: "#56b4e9", symbol: "diamond" },
  { code: "FCR", label: "Fire-cracked stone", material: "stone", colour: "#d55e00", symbol: "square" },
  { code: "SHD", label: "Pottery sherd", material: "ceramic", colour: "#009e73", symbol: "disc" },
  { code: "BBN", label: "Burnt bone", material: "bone", colour: "#cc79a7", symbol: "cross" },
  { code: "HUM", label: "Human bone", material: "bone", colour: "#000000", symbol: "star", humanRemains: true },
] as const;

const TRENCH_B = {
  outer: [
    [20, 0],
    [27.5, 1],
    [28.5, 6.5],
    [24, 9],
    [19.5, 6],
  ] as Pt[],
  holes: [],
};
const TRENCH_C = {
  outer: [
    [0, 14],
    [6, 14],
    [6, 18],
    [4, 18],
    [4, 16],
    [2, 16],
    [2, 19],
    [0, 19],
  ] as Pt[],
  holes: [],
};

type ContextSpec = {
  number: number;
  trench: "A" | "B" | "C";
  type: (typeof s.contextTypeEnum.enumValues)[number];
  colour: string;
  compaction: string;
  composition: string;
  description: string;
  interpretation: string;
};
const CONTEXTS: ContextSpec[] = [
  {
    number: 1001,
    trench: "A",
    type: "layer",
    colour: "dark greyish brown",
    compaction: "loose",
    composition: "silty loam",
    description: "Turf and topsoil over the whole trench.",
    interpretation: "Modern ploughsoil.",
  },
  {
    number: 1002,
    trench: "A",
    type: "layer",
    colour: "mid orange brown",
    compaction: "firm",
    composition: "sandy silt",
    description: "Subsoil with rare charcoal flecks.",
    interpretation: "Colluvium sealing the surface.",
  },
  {
    number: 1003,
    trench: "A",
    type: "cut",
    colour: "",
    compaction: "",
    composition: "",
    description: "Sub-circular cut, 0.9 m across, steep sides, concave base.",
    interpretation: "Pit.",
  },
  {
    number: 1004,
    trench: "A",
    type: "fill",
    colour: "black",
    compaction: "friable",
    composition: "charcoal-rich silt",
    description: "Single fill of pit 1003 with burnt stone.",
    interpretation: "Dump of hearth rake-out.",
  },
  {
    number: 1005,
    trench: "A",
    type: "deposit",
    colour: "pale grey",
    compaction: "compact",
    composition: "sand with flint debitage",
    description: "Thin trampled surface with knapping debris and burnt stone.",
    interpretation: "Occupation surface around a knapping area.",
  },
  {
    number: 2001,
    trench: "B",
    type: "layer",
    colour: "dark brown",
    compaction: "loose",
    composition: "loam",
    description: "Topsoil.",
    interpretation: "Ploughsoil.",
  },
  {
    number: 2002,
    trench: "B",
    type: "deposit",
    colour: "reddish brown",
    compaction: "firm",
    composition: "burnt sand",
    description: "Spread of burnt material.",
    interpretation: "Burning episode.",
  },
  {
    number: 3001,
    trench: "C",
    type: "layer",
    colour: "dark brown",
    compaction: "loose",
    composition: "loam",
    description: "Topsoil.",
    interpretation: "Ploughsoil.",
  },
  {
    number: 3002,
    trench: "C",
    type: "fill",
    colour: "mid grey",
    compaction: "soft",
    composition: "clayey silt",
    description: "Fill of a shallow grave-shaped cut; work stopped on exposure of bone.",
    interpretation: "Possible burial; reported.",
  },
];
/** from <kind> to — a valid matrix: no loops. */
const RELATIONS: [number, s.ContextRelation["kind"], number][] = [
  [1001, "above", 1002],
  [1002, "above", 1004],
  [1004, "fills", 1003],
  [1003, "cuts", 1005],
  [1002, "above", 1005],
  [2001, "above", 2002],
  [3001, "above", 3002],
];

/** Creates the demo site once; running it again changes nothing. Returns whether it created anything. */
export async function seedDemo(db: Db): Promise<{ created: boolean; siteId: string }> {
  const [existing] = await db.select().from(s.sites).where(eq(s.sites.code, DEMO_SITE_CODE));
  if (existing) return { created: false, siteId: existing.id };
  const hashes = await Promise.all(DEMO_USERS.map((u) => hashPassword(u.password)));
  return db.transaction(async (tx) => {
    const [site] = await tx
      .insert(s.sites)
      .values({
        code: DEMO_SITE_CODE,
        name: "Whinnydale Holm",
        gridDescription:
          "Site grid laid out from peg WH1 (0, 0), axes parallel to the National Grid; metres. Invented demo site.",
        crs: DEMO_PLACEMENT.crs,
        gridOriginX: DEMO_PLACEMENT.gridOriginX,
        gridOriginY: DEMO_PLACEMENT.gridOriginY,
        datumKind: "local",
        datumName: "Whinnydale site datum (TBM WH1 taken as 50.000 m)",
        levelTolerance: 0.005,
      })
      .returning();
    for (const [k, u] of DEMO_USERS.entries()) {
      const [user] = await tx
        .insert(s.users)
        .values({ email: u.email, name: u.name, passwordHash: hashes[k] })
        .onConflictDoUpdate({ target: s.users.email, set: { name: u.name } })
        .returning();
      await tx.insert(s.memberships).values({ siteId: site.id, userId: user.id, role: u.role });
    }
    const [director] = await tx.select().from(s.users).where(eq(s.users.email, DEMO_USERS[2].email));
    const [digger] = await tx.select().from(s.users).where(eq(s.users.email, DEMO_USERS[0].email));

    const windows = { A: windowOf(DEMO_TRENCH), B: windowOf(TRENCH_B), C: windowOf(TRENCH_C) };
    const trenchRows = await tx
      .insert(s.trenches)
      .values([
        {
          siteId: site.id,
          code: "A",
          name: "Knapping floor",
          outline: windowToPolygon(windows.A),
          surfaceLevel: DEMO_SURFACE.A,
        },
        {
          siteId: site.id,
          code: "B",
          name: "Burnt spread",
          outline: windowToPolygon(windows.B),
          surfaceLevel: DEMO_SURFACE.B,
        },
        {
          siteId: site.id,
          code: "C",
          name: "Southern extension",
          outline: windowToPolygon(windows.C),
          surfaceLevel: DEMO_SURFACE.C,
        },
      ])
      .returning();
    const trenchId = Object.fromEntries(trenchRows.map((t) => [t.code, t.id])) as Record<"A" | "B" | "C", string>;
    const ctxRows = await tx
      .insert(s.contexts)
      .values(
        CONTEXTS.map(({ trench, ...c }) => ({
          ...c,
          siteId: site.id,
          trenchId: trenchId[trench],
          recordedBy: digger.id,
        })),
      )
      .returning();
    const ctx = Object.fromEntries(ctxRows.map((c) => [c.number, c])) as Record<number, s.Context>;
    await tx.insert(s.contextRelations).values(
      RELATIONS.map(([a, kind, b]) => ({
        siteId: site.id,
        fromId: ctx[a].id,
        toId: ctx[b].id,
        kind,
        createdBy: digger.id,
      })),
    );
    const classRows = await tx
      .insert(s.artefactClasses)
      .values(CLASSES.map((c) => ({ ...c, siteId: site.id })))
      .returning();
    const cls = Object.fromEntries(classRows.map((c) => [c.code, c.id])) as Record<
      (typeof CLASSES)[number]["code"],
      string
    >;

    const rng = createRandom(DEMO_SEED);
    const centres: Pt[] = [
      [2.2, 2.0],
      [2.6, 6.2],
      [10.4, 2.8],
    ];
    const groups: { cls: keyof typeof cls; context: number; trench: "A" | "B" | "C"; pts: Pt[] }[] = [
      { cls: "FLK", context: 1005, trench: "A", pts: clusteredLayout(windows.A, 150, centres, 0.45, rng) },
      { cls: "CHP", context: 1005, trench: "A", pts: clusteredLayout(windows.A, 110, centres, 0.55, rng) },
      { cls: "FCR", context: 1005, trench: "A", pts: evenLayout(windows.A, 60, 0.75, rng) },
      { cls: "SHD", context: 1005, trench: "A", pts: randomLayout(windows.A, 90, rng) },
      { cls: "SHD", context: 1002, trench: "A", pts: randomLayout(windows.A, 25, rng) },
      { cls: "FCR", context: 1004, trench: "A", pts: clusteredLayout(windows.A, 12, [[9.6, 3.3]], 0.15, rng) },
      { cls: "BBN", context: 2002, trench: "B", pts: randomLayout(windows.B, 70, rng) },
      { cls: "SHD", context: 2001, trench: "B", pts: randomLayout(windows.B, 20, rng) },
      { cls: "SHD", context: 3001, trench: "C", pts: randomLayout(windows.C, 15, rng) },
      { cls: "HUM", context: 3002, trench: "C", pts: [[1.0, 17.6]] },
    ];
    let number = 1;
    const start = Date.UTC(2026, 5, 8, 8, 0, 0);
    const rows = groups.flatMap((g) =>
      g.pts.map(([x, y]) => ({
        siteId: site.id,
        trenchId: trenchId[g.trench],
        contextId: ctx[g.context].id,
        classId: cls[g.cls],
        number: number++,
        x: Math.round(x * 1000) / 1000,
        y: Math.round(y * 1000) / 1000,
        // Reduced levels: 0.30–0.40 m below the trench's ground surface.
        z: Math.round((DEMO_SURFACE[g.trench] - 0.3 - 0.1 * rng.next()) * 1000) / 1000,
        count: 1,
        weightG: Math.round((0.5 + 20 * rng.next()) * 10) / 10,
        description: "",
        method: "plan" as const,
        recordedBy: digger.id,
        recordedAt: new Date(start + number * 7 * 60_000),
      })),
    );
    for (let i = 0; i < rows.length; i += 500) await tx.insert(s.finds).values(rows.slice(i, i + 500));
    await seedDemoLevels(tx, { siteId: site.id, trenchId, contextId: (n: number) => ctx[n]!.id, diggerId: digger.id });
    await seedDemoSquares(tx, {
      siteId: site.id,
      trenchId: trenchId.A,
      contextId: ctx[1005]!.id,
      classId: (code) => cls[code],
      diggerId: digger.id,
    });
    await tx.update(s.sites).set({ nextFindNumber: number }).where(eq(s.sites.id, site.id));
    await tx.insert(s.auditEntries).values({
      siteId: site.id,
      actorId: director.id,
      action: "seed",
      recordType: "site",
      recordId: site.id,
      after: { finds: rows.length },
    });
    return { created: true, siteId: site.id };
  });
}
