import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite, squareWithBaulk } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as importRoute from "@/app/api/sites/[siteId]/import/route";
import * as previewRoute from "@/app/api/sites/[siteId]/import/preview/route";
import * as mappingRoute from "@/app/api/sites/[siteId]/import/mapping/route";
import * as exportFindsRoute from "@/app/api/sites/[siteId]/export/finds/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";

const mapping = { number: "Pt", x: "E", y: "N", z: "H", classCode: "Code", contextNumber: "Ctx" };

async function findsOf(siteId: string) {
  const db = await getDb();
  return db.select().from(schema.finds).where(eq(schema.finds.siteId, siteId));
}

describe("total-station import", () => {
  it("refuses a file with two bad rows, naming both, imports nothing, then imports the fixed file", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const c = fx.context.number;
    const bad = [
      "Pt,E,N,H,Code,Ctx",
      `101,1.25,2.5,10.1,FL,${c}`,
      `102,3.5,4.0,10.0,XX,${c}`,
      `103,2.0,abc,10.0,FL,${c}`,
      `104,8.0,5.5,9.9,FL,${c}`,
    ].join("\n");
    const preview = await call(
      previewRoute,
      "POST",
      { siteId: fx.site.id },
      { csv: bad, fileName: "day1.csv", mapping },
    );
    expect(preview.status).toBe(200);
    expect(preview.json.rowCount).toBe(4);
    expect(preview.json.validCount).toBe(2);
    // Row numbers as a spreadsheet shows them: the header is row 1.
    expect(preview.json.errors).toEqual([
      { row: 3, reasons: ['class code "XX" is not one of this site\'s classes'] },
      { row: 4, reasons: ['y "abc" is not a number'] },
    ]);

    const refused = await call(
      importRoute,
      "POST",
      { siteId: fx.site.id },
      { csv: bad, fileName: "day1.csv", mapping },
    );
    expect(refused.status).toBe(400);
    expect(refused.json.error).toContain("2 of 4 rows cannot be imported, so nothing was imported");
    expect(refused.json.details.errors.map((e: any) => e.row)).toEqual([3, 4]);
    expect(await findsOf(fx.site.id)).toHaveLength(0);

    const fixed = bad.replace(",XX,", ",FL,").replace(",abc,", ",4.5,");
    const done = await call(importRoute, "POST", { siteId: fx.site.id }, { csv: fixed, fileName: "day1.csv", mapping });
    expect(done.status).toBe(201);
    expect(done.json).toMatchObject({ imported: 4, firstNumber: 101, lastNumber: 104 });
    const rows = (await findsOf(fx.site.id)).sort((a, b) => a.number - b.number);
    expect(rows.map((r) => [r.number, r.x, r.y, r.z, r.method])).toEqual([
      [101, 1.25, 2.5, 10.1, "imported"],
      [102, 3.5, 4.0, 10.0, "imported"],
      [103, 2.0, 4.5, 10.0, "imported"],
      [104, 8.0, 5.5, 9.9, "imported"],
    ]);
    // Each imported find's trail starts with the import, naming the file's trail entry; the refused file left none.
    const db = await getDb();
    const [fileEntry] = await db
      .select()
      .from(schema.auditEntries)
      .where(
        and(
          eq(schema.auditEntries.siteId, fx.site.id),
          eq(schema.auditEntries.recordType, "import"),
          eq(schema.auditEntries.action, "import"),
        ),
      );
    expect(fileEntry.after).toMatchObject({ fileName: "day1.csv", rows: 4, numbers: [101, 104] });
    const trail = await db
      .select()
      .from(schema.auditEntries)
      .where(and(eq(schema.auditEntries.siteId, fx.site.id), eq(schema.auditEntries.recordType, "find")));
    expect(
      trail
        .map((e) => [
          e.action,
          e.recordId,
          (e.after as { number: number; importId: string }).number,
          (e.after as { importId: string }).importId,
        ])
        .sort((a, b) => Number(a[2]) - Number(b[2])),
    ).toEqual(rows.map((r) => ["import", r.id, r.number, fileEntry.recordId]));
    // Numbers up to the highest imported are spent; the next find typed in gets 105.
    const next = await call(
      findsRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: fx.context.id, classId: fx.cls.id, x: 1, y: 1 },
    );
    expect(next.json.number).toBe(105);
    // The mapping is remembered for the site's next file.
    const remembered = await call(mappingRoute, "GET", { siteId: fx.site.id });
    expect(remembered.json.mapping).toEqual(mapping);
    const again = await call(previewRoute, "POST", { siteId: fx.site.id }, { csv: fixed, fileName: "day1.csv" });
    expect(again.json.mappingSource).toBe("remembered");
    expect(again.json.errors.map((e: any) => e.reasons[0])).toEqual(
      [101, 102, 103, 104].map((n) => `find number ${n} is already in use on this site`),
    );
  });

  it("names every kind of bad row: outside the trench with distance, unknown context, duplicate number, signed-off context", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [locked] = await db
      .insert(schema.contexts)
      .values({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        number: 4444,
        type: "fill",
        state: "signed_off",
        signedOffAt: new Date("2026-11-20T09:00:00Z"),
        signedOffBy: fx.people.director.id,
      })
      .returning();
    const [waiting] = await db
      .insert(schema.contexts)
      .values({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        number: 4445,
        type: "fill",
        state: "awaiting",
        submittedAt: new Date("2026-11-25T09:00:00Z"),
        submittedBy: fx.people.digger.id,
      })
      .returning();
    session.userId = fx.people.director.id;
    const c = fx.context.number;
    const csv = [
      "Pt,E,N,H,Code,Ctx",
      `1,12,3,,FL,${c}`, // 2 m east of the 10 m edge
      `2,5,2.5,,FL,${c}`, // inside the 4–6 × 2–3 baulk: 0.5 m from its long side
      `3,1,1,,FL,9999`,
      `4,1,1,,FL,${c}`,
      `4,2,2,,FL,${c}`,
      `5,1,1,,FL,${locked.number}`,
      `6,1,1,,FL,${waiting.number}`,
    ].join("\n");
    const res = await call(importRoute, "POST", { siteId: fx.site.id }, { csv, mapping });
    expect(res.status).toBe(400);
    // Distances worked by hand from the fixture's 10 × 6 m trench and its baulk.
    expect(res.json.details.errors).toEqual([
      { row: 2, reasons: ["(12, 3) lies 2.000 m outside trench A"] },
      { row: 3, reasons: ["(5, 2.5) lies 0.500 m outside trench A"] },
      { row: 4, reasons: ['context "9999" does not exist on this site'] },
      { row: 6, reasons: ["find number 4 is also on row 5"] },
      { row: 7, reasons: ["context 4444 was signed off by Director on 2026-11-20; a director must reopen it first"] },
      {
        row: 8,
        reasons: [
          "context 4445 awaits sign-off (submitted by Digger on 2026-11-25); a director must return it to open first",
        ],
      },
    ]);
    expect(await findsOf(fx.site.id)).toHaveLength(0);
  });

  it("round-trips: the register's CSV export imports into a site with the same contexts and classes", async () => {
    const a = await makeSite();
    session.userId = a.people.digger.id;
    const made = [
      { x: 1.5, y: 1.25, z: 10.5, description: "flake, cortex on one face" },
      { x: 8.75, y: 5.5, z: null, description: 'core "B", refits' },
      { x: 0.5, y: 4.0, z: 9.75, description: "" },
      // Guarded against spreadsheet formulas on export, given back as typed on import.
      { x: 2.5, y: 0.5, z: 9.5, description: "-2+3+cmd|' /C calc'!A0" },
      { x: 3.5, y: 0.5, z: 9.5, description: "'=already quoted" },
    ];
    for (const m of made)
      await call(findsRoute, "POST", { siteId: a.site.id }, { contextId: a.context.id, classId: a.cls.id, ...m });
    // The harness parses JSON answers; the CSV is read as text from the handler directly.
    const res = await exportFindsRoute.GET(new Request("http://localhost/x?format=csv"), {
      params: Promise.resolve({ siteId: a.site.id }),
    });
    const text = await res.text();
    expect(res.headers.get("content-type")).toContain("text/csv");

    const b = await makeSite();
    const db = await getDb();
    const [twin] = await db
      .insert(schema.contexts)
      .values({ siteId: b.site.id, trenchId: b.trench.id, number: a.context.number, type: "layer" })
      .returning();
    expect(b.trench.outline).toEqual(squareWithBaulk);
    session.userId = b.people.digger.id;
    // No mapping given: the guess from the export's own header names must be enough.
    const preview = await call(previewRoute, "POST", { siteId: b.site.id }, { csv: text });
    expect(preview.json.mappingSource).toBe("guessed");
    expect(preview.json.errors).toEqual([]);
    const done = await call(importRoute, "POST", { siteId: b.site.id }, { csv: text, mapping: preview.json.mapping });
    expect(done.status).toBe(201);
    const back = (await findsOf(b.site.id)).sort((p, q) => p.number - q.number);
    const orig = (await findsOf(a.site.id)).sort((p, q) => p.number - q.number);
    expect(back.map((f) => [f.number, f.x, f.y, f.z, f.description, f.contextId])).toEqual(
      orig.map((f) => [f.number, f.x, f.y, f.z, f.description, twin.id]),
    );
  });
});
