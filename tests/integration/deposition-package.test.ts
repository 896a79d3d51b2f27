import { createHash } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { and, count, eq } from "drizzle-orm";
import { unzipSync } from "fflate";
import Papa from "papaparse";
import { session } from "../support/harness";
import { checkBag } from "../support/bagit-check";
import { pdfText } from "../support/pdf-text";
import { markedPaths, pdfContent } from "../support/pdf-content";
import { FINDS_TAG } from "@/lib/server/export/trench-record-pdf";
import { symbolPath, type SymbolShape } from "@/lib/geometry/symbol-paths";
import { makeUser } from "../support/fixtures";
import { seedDemoSite, type DemoSite } from "../support/demo-site";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { seedDemoPhoto } from "@/scripts/seed/seed-demo-photo";
import { allFinds, findsByNumber } from "@/lib/server/finds";
import * as packageRoute from "@/app/api/sites/[siteId]/export/package/route";

let demo: DemoSite;
let boxed: { box: number; finds: string[]; sent: string };

async function fetchPackage(userId: string | null, query: Record<string, string> = {}) {
  session.userId = userId;
  const url = new URL("http://localhost/api/sites/x/export/package");
  for (const [k, v] of Object.entries(query)) url.searchParams.set(k, v);
  const res = await packageRoute.GET(new Request(url), { params: Promise.resolve({ siteId: demo.siteId }) });
  return { res, bytes: new Uint8Array(await res.arrayBuffer()) };
}

const csvRows = (bytes: Uint8Array | undefined) =>
  Papa.parse<Record<string, string>>(new TextDecoder().decode(bytes), { header: true, skipEmptyLines: true });

beforeAll(async () => {
  demo = await seedDemoSite();
  const db = await getDb();
  await seedDemoPhoto(db);
  const [ctx] = await db.select().from(s.contexts).where(eq(s.contexts.siteId, demo.siteId)).limit(1);
  for (const n of [1, 2, 3])
    await db.insert(s.samples).values({
      location: n === 3 ? "cold store" : "",
      siteId: demo.siteId,
      trenchId: ctx!.trenchId,
      contextId: ctx!.id,
      number: n,
      type: n === 1 ? "charcoal" : "bulk",
      takenOn: "2026-07-02",
      volumeL: n === 1 ? null : 20 * n,
      purpose: n === 1 ? "=radiocarbon" : "flotation",
    });
  // One box in the store, holding two finds and a sample; a third find sent out to a specialist.
  const [box] = await db
    .insert(s.boxes)
    .values({ siteId: demo.siteId, number: 7, store: "Riverside store, bay 3", note: "flint" })
    .returning();
  const firstFinds = await db
    .select()
    .from(s.finds)
    .where(eq(s.finds.siteId, demo.siteId))
    .orderBy(s.finds.number)
    .limit(3);
  for (const f of firstFinds.slice(0, 2))
    await db.update(s.finds).set({ processing: "boxed", boxId: box!.id }).where(eq(s.finds.id, f.id));
  await db
    .update(s.finds)
    .set({ processing: "sent", sentTo: "Lithics laboratory", location: "on loan" })
    .where(eq(s.finds.id, firstFinds[2]!.id));
  boxed = { box: 7, finds: firstFinds.slice(0, 2).map((f) => String(f.number)), sent: String(firstFinds[2]!.number) };
  const [drawing] = await db
    .insert(s.drawings)
    .values({ siteId: demo.siteId, trenchId: ctx!.trenchId, number: 1, kind: "plan", scale: 20, drawnOn: "2026-07-02" })
    .returning();
  await db.insert(s.drawingContexts).values({ drawingId: drawing!.id, contextId: ctx!.id });
  await db.insert(s.analysisRuns).values({
    siteId: demo.siteId,
    trenchId: demo.trenchId,
    scope: { trench: "A" },
    method: "ripley_l",
    params: { rmax: 2 },
    seed: 42,
    status: "done",
    progress: 1,
    result: { verdict: "clustered" },
    engineVersion: "test",
    fingerprint: "f".repeat(64),
    finishedAt: new Date(),
  });
}, 240_000);

describe("deposition package", () => {
  it("is refused to everyone but a director of the site", async () => {
    const stranger = await makeUser("Stranger");
    expect((await fetchPackage(null)).res.status).toBe(401);
    expect((await fetchPackage(stranger.id)).res.status).toBe(404);
    expect((await fetchPackage(demo.people.digger!)).res.status).toBe(403);
    expect((await fetchPackage(demo.people.specialist!)).res.status).toBe(403);
    expect((await fetchPackage(demo.people.director!)).res.status).toBe(200);
  });

  it("is a valid BagIt bag whose registers hold every record of the site", async () => {
    const { res, bytes } = await fetchPackage(demo.people.director!);
    expect(res.headers.get("content-type")).toBe("application/zip");
    expect(res.headers.get("content-disposition")).toMatch(
      /^attachment; filename="WHD26-deposition-\d{4}-\d\d-\d\d\.zip"$/,
    );
    const bag = checkBag(unzipSync(bytes));
    expect(bag.problems).toEqual([]);
    expect(bag.root).toMatch(/^WHD26-deposition-/);

    // The fingerprint stated in bag-info.txt is the SHA-256 of the payload manifest.
    const manifest = bag.files.get("manifest-sha256.txt")!;
    expect(bag.info.get("Package-Fingerprint")).toBe(`sha256:${createHash("sha256").update(manifest).digest("hex")}`);
    expect(bag.info.get("External-Identifier")).toBe("WHD26");
    expect(bag.info.get("Exported-By")).toBeTruthy();

    const db = await getDb();
    const n = async (table: typeof s.finds | typeof s.contexts, col: any) =>
      (await db.select({ n: count() }).from(table).where(eq(col, demo.siteId)))[0]!.n;
    const expected: Record<string, number> = {
      "trenches.csv": await n(s.trenches as never, s.trenches.siteId),
      "contexts.csv": await n(s.contexts, s.contexts.siteId),
      "relations.csv": await n(s.contextRelations as never, s.contextRelations.siteId),
      "classes.csv": await n(s.artefactClasses as never, s.artefactClasses.siteId),
      "finds.csv": await n(s.finds, s.finds.siteId),
      "samples.csv": 3,
      "drawings.csv": 1,
      "levels.csv": await n(s.spotLevels as never, s.spotLevels.siteId),
      "benchmarks.csv": await n(s.benchmarks as never, s.benchmarks.siteId),
      "photos.csv": await n(s.photos as never, s.photos.siteId),
      "analysis-runs.csv": 1,
    };
    // The seeded site is not trivially small: a register that came out empty would prove nothing.
    for (const file of ["contexts.csv", "relations.csv", "finds.csv", "levels.csv", "photos.csv"])
      expect(expected[file], file).toBeGreaterThan(0);
    for (const [file, rows] of Object.entries(expected)) {
      const parsed = csvRows(bag.files.get(`data/registers/${file}`));
      expect(parsed.errors, file).toEqual([]);
      expect(parsed.data.length, file).toBe(rows);
    }

    // Records not signed off are marked so: each find carries its context's state as the database holds it.
    const states = new Map(
      (
        await db
          .select({ number: s.finds.number, state: s.contexts.state })
          .from(s.finds)
          .innerJoin(s.contexts, eq(s.contexts.id, s.finds.contextId))
          .where(eq(s.finds.siteId, demo.siteId))
      ).map((r) => [String(r.number), r.state]),
    );
    for (const row of csvRows(bag.files.get("data/registers/finds.csv")).data)
      expect(row.context_state, `find ${row.number}`).toBe(states.get(row.number!));

    // A formula-looking purpose is written inert; the photo's file is in the bag where its register says.
    const samples = csvRows(bag.files.get("data/registers/samples.csv")).data;
    expect(samples.find((r) => r.number === "1")?.purpose).toBe("'=radiocarbon");
    for (const photo of csvRows(bag.files.get("data/registers/photos.csv")).data) {
      expect(photo.copy).toBe("display");
      expect(bag.files.get(`data/${photo.file}`)?.byteLength).toBeGreaterThan(1000);
    }
    expect(new TextDecoder().decode(bag.files.get("data/matrix/matrix.svg"))).toMatch(/^<svg[\s\S]*<\/svg>\s*$/);
    const run = JSON.parse(
      new TextDecoder().decode(
        bag.files.get(`data/${csvRows(bag.files.get("data/registers/analysis-runs.csv")).data[0]!.result_file}`),
      ),
    );
    expect(run.result).toEqual({ verdict: "clustered" });

    // The readme describes every column of every register it ships.
    const readme = new TextDecoder().decode(bag.files.get("data/README.txt"));
    for (const file of Object.keys(expected)) {
      const header = csvRows(bag.files.get(`data/registers/${file}`)).meta.fields ?? [];
      expect(readme).toContain(`registers/${file}`);
      for (const col of header) expect(readme, `${file} ${col}`).toMatch(new RegExp(`\\n  ${col}: (?!${col}\\n)`));
    }
  });

  it("says where each find and sample is kept, and lists the boxes with what they hold", async () => {
    const db = await getDb();
    const [box] = await db.select().from(s.boxes).where(eq(s.boxes.siteId, demo.siteId));
    await db
      .update(s.samples)
      .set({ boxId: box!.id })
      .where(and(eq(s.samples.siteId, demo.siteId), eq(s.samples.number, 2)));
    const bag = checkBag(unzipSync((await fetchPackage(demo.people.director!)).bytes));
    expect(bag.problems).toEqual([]);
    const findRows = csvRows(bag.files.get("data/registers/finds.csv")).data;
    const byNumber = new Map(findRows.map((r) => [r.number, r]));
    for (const n of boxed.finds) expect(byNumber.get(n)).toMatchObject({ processing: "boxed", box: String(boxed.box) });
    expect(byNumber.get(boxed.sent)).toMatchObject({
      processing: "sent",
      sent_to: "Lithics laboratory",
      box: "",
      location: "on loan",
    });
    expect(findRows.filter((r) => r.box !== "").length).toBe(2);
    expect(findRows.filter((r) => r.processing === "lifted").length).toBe(findRows.length - 3);
    const sampleRows = new Map(csvRows(bag.files.get("data/registers/samples.csv")).data.map((r) => [r.number, r]));
    expect(sampleRows.get("2")).toMatchObject({ box: "7", location: "" });
    expect(sampleRows.get("3")).toMatchObject({ box: "", location: "cold store" });
    expect(csvRows(bag.files.get("data/registers/boxes.csv")).data).toEqual([
      { number: "7", store: "Riverside store, bay 3", note: "flint", finds: "2", samples: "1" },
    ]);
    // The readme says what the new columns mean.
    const readme = new TextDecoder().decode(bag.files.get("data/README.txt"));
    expect(readme).toMatch(/box: number of the box/);
  });

  it("holds each trench's record as a PDF naming the trench, its contexts and its finds by class, on the plan too", async () => {
    const db = await getDb();
    const { bytes } = await fetchPackage(demo.people.director!);
    const bag = checkBag(unzipSync(bytes));
    const trenchRows = await db.select().from(s.trenches).where(eq(s.trenches.siteId, demo.siteId));
    expect(trenchRows.length).toBeGreaterThan(0);
    for (const t of trenchRows) {
      const file = bag.files.get(`data/records/trench-${t.code}.pdf`);
      expect(file, `trench ${t.code}`).toBeDefined();
      expect(new TextDecoder().decode(file!.slice(0, 5))).toBe("%PDF-");
      const { pages, title } = await pdfText(file!);
      expect(title).toBe(`Trench ${t.code} record - WHD26 Whinnydale Holm`);
      const text = pages.join("\n");
      expect(text).toContain(`Trench ${t.code}`);
      const sheets = await db.select().from(s.contexts).where(eq(s.contexts.trenchId, t.id));
      for (const c of sheets) expect(text, `context ${c.number}`).toContain(`Context ${c.number} · ${c.type}`);
      // Finds by context and class: the "All" row is the trench's count of finds.
      const [found] = await db.select({ n: count() }).from(s.finds).where(eq(s.finds.trenchId, t.id));
      expect(text).toMatch(new RegExp(`\nAll\n\n${found!.n}\n`));
      expect(text).toContain(t.signedOffAt ? "Signed off by" : "Not signed off");
      // The plan draws each class's finds as one path of its symbols, in its colour: as many as it has.
      const byClass = await db
        .select({ colour: s.artefactClasses.colour, symbol: s.artefactClasses.symbol, n: count() })
        .from(s.finds)
        .innerJoin(s.artefactClasses, eq(s.artefactClasses.id, s.finds.classId))
        .where(eq(s.finds.trenchId, t.id))
        .groupBy(s.artefactClasses.code, s.artefactClasses.colour, s.artefactClasses.symbol)
        .orderBy(s.artefactClasses.code);
      const drawn = (await pdfContent(file!)).flatMap((page) => markedPaths(page, FINDS_TAG));
      expect(drawn.map((d) => d.fill.map((v) => Math.round(v * 255)))).toEqual(
        byClass.map((c) => [1, 3, 5].map((i) => parseInt(c.colour.slice(i, i + 2), 16))),
      );
      byClass.forEach((c, i) => {
        const subpaths = (symbolPath[c.symbol as SymbolShape].match(/M/g) ?? []).length;
        expect(drawn[i]!.ops.filter((o) => o.op === "m").length / subpaths, c.symbol).toBe(c.n);
      });
      expect(byClass.reduce((a, c) => a + c.n, 0)).toBe(found!.n);
    }
    expect(new TextDecoder().decode(bag.files.get("data/README.txt"))).toContain("records/");
  });

  it("reads the finds a page at a time, each once and in number order, as the register reads them at once", async () => {
    const db = await getDb();
    const whole = await allFinds(db, demo.siteId, { sort: "number", dir: "asc" });
    const paged = [];
    let pages = 0;
    for await (const page of findsByNumber(db, demo.siteId, {}, 7)) {
      expect(page.length).toBeLessThanOrEqual(7);
      paged.push(...page);
      pages++;
    }
    expect(whole.length).toBeGreaterThan(14);
    expect(pages).toBe(Math.ceil(whole.length / 7));
    expect(paged).toEqual(whole);
  });

  it("fails validation when a byte changes, a file is added or a tag file is edited", async () => {
    const { bytes } = await fetchPackage(demo.people.director!);
    const entries = unzipSync(bytes);
    const root = Object.keys(entries)[0]!.split("/")[0];
    expect(checkBag(entries).problems).toEqual([]);

    const changed = { ...entries };
    const finds = new Uint8Array(changed[`${root}/data/registers/finds.csv`]!);
    finds[finds.length - 3] ^= 1;
    changed[`${root}/data/registers/finds.csv`] = finds;
    expect(checkBag(changed).problems).toEqual(["data/registers/finds.csv: digest does not match the manifest"]);

    const extra = { ...entries, [`${root}/data/registers/extra.csv`]: new TextEncoder().encode("a\r\n1\r\n") };
    expect(checkBag(extra).problems).toContain("payload file data/registers/extra.csv is not in the manifest");

    const info = { ...entries };
    info[`${root}/bag-info.txt`] = new TextEncoder().encode(
      new TextDecoder().decode(entries[`${root}/bag-info.txt`]).replace("WHD26", "WHD27"),
    );
    expect(checkBag(info).problems).toEqual(["bag-info.txt: digest does not match the tag manifest"]);

    const missing = { ...entries };
    delete missing[`${root}/data/README.txt`];
    expect(checkBag(missing).problems).toContain("manifest lists data/README.txt, which is not in the bag");
    expect(checkBag(missing).problems.some((p) => p.startsWith("Payload-Oxum says"))).toBe(true);

    const bagit = { ...entries, [`${root}/bagit.txt`]: new TextEncoder().encode("BagIt-Version: 1.0\n") };
    expect(checkBag(bagit).problems.some((p) => p.startsWith("bagit.txt is not the two lines"))).toBe(true);

    const manifest = { ...entries };
    manifest[`${root}/manifest-sha256.txt`] = new TextEncoder().encode(
      new TextDecoder().decode(entries[`${root}/manifest-sha256.txt`]).replace(/^([0-9a-f]{64}) {2}/, "$1"),
    );
    expect(checkBag(manifest).problems.some((p) => p.startsWith("manifest-sha256.txt: malformed line"))).toBe(true);
  });

  it("exports one trench only once it is signed off, with only that trench's records", async () => {
    const db = await getDb();
    const refused = await fetchPackage(demo.people.director!, { trenchId: demo.trenchId });
    expect(refused.res.status).toBe(400);
    const body = JSON.parse(new TextDecoder().decode(refused.bytes));
    expect(body.fieldErrors.trenchId[0]).toMatch(/not signed off/);

    await db.update(s.trenches).set({ signedOffAt: new Date() }).where(eq(s.trenches.id, demo.trenchId));
    const { bytes } = await fetchPackage(demo.people.director!, { trenchId: demo.trenchId });
    const bag = checkBag(unzipSync(bytes));
    expect(bag.problems).toEqual([]);
    expect(bag.info.get("Trench")).toBe("A");
    const [inTrench] = await db.select({ n: count() }).from(s.finds).where(eq(s.finds.trenchId, demo.trenchId));
    const [onSite] = await db.select({ n: count() }).from(s.finds).where(eq(s.finds.siteId, demo.siteId));
    expect(inTrench!.n).toBeLessThan(onSite!.n);
    expect(csvRows(bag.files.get("data/registers/finds.csv")).data.length).toBe(inTrench!.n);
    expect(csvRows(bag.files.get("data/registers/trenches.csv")).data.map((r) => r.code)).toEqual(["A"]);
  });
});
