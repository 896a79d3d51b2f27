import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { guessMapping } from "@/lib/server/import/guess";
import * as importRoute from "@/app/api/sites/[siteId]/import/route";
import * as previewRoute from "@/app/api/sites/[siteId]/import/preview/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";

describe("a total station's point IDs on import", () => {
  it("takes a point-ID column for the station point, never for the find number", () => {
    for (const header of ["Pt", "PT_ID", "Point", "Point ID", "point_no", "ID", "Station point"]) {
      const guess = guessMapping([header, "E", "N", "Code", "Ctx"]);
      expect(guess.stationPoint, header).toBe(header);
      expect(guess.number, header).toBeUndefined();
    }
    expect(guessMapping(["Find no", "Pt", "E", "N"])).toMatchObject({ number: "Find no", stationPoint: "Pt" });
  });

  it("imports a file whose point IDs repeat the site's find numbers: numbers are allocated, point IDs kept", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    for (const [x, y] of [
      [1, 1],
      [2, 2],
      [3, 1],
    ])
      expect(
        (await call(findsRoute, "POST", { siteId: fx.site.id }, { contextId: fx.context.id, classId: fx.cls.id, x, y }))
          .status,
      ).toBe(201);
    const c = fx.context.number;
    const csv = [
      "Pt,E,N,H,Code,Ctx",
      `1,1.25,2.5,10.1,FL,${c}`,
      `2,3.5,4.0,10.0,FL,${c}`,
      `3,8.0,5.5,9.9,FL,${c}`,
    ].join("\n");

    const preview = await call(previewRoute, "POST", { siteId: fx.site.id }, { csv, fileName: "day2.csv" });
    expect(preview.status).toBe(200);
    expect(preview.json.mapping).toMatchObject({ stationPoint: "Pt", x: "E", y: "N" });
    expect(preview.json.mapping.number).toBeUndefined();
    expect(preview.json.errors).toEqual([]);

    const done = await call(
      importRoute,
      "POST",
      { siteId: fx.site.id },
      { csv, fileName: "day2.csv", mapping: preview.json.mapping },
    );
    expect(done.status).toBe(201);
    expect(done.json).toMatchObject({ imported: 3, firstNumber: 4, lastNumber: 6 });
    const db = await getDb();
    const rows = (await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id))).sort(
      (a, b) => a.number - b.number,
    );
    expect(rows.map((r) => [r.number, r.stationPoint, r.method])).toEqual([
      [1, null, "typed"],
      [2, null, "typed"],
      [3, null, "typed"],
      [4, "1", "imported"],
      [5, "2", "imported"],
      [6, "3", "imported"],
    ]);
  });

  it("keeps the find numbers of a column mapped to them on purpose, and the point IDs beside them", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const c = fx.context.number;
    const csv = ["Find no,Pt,E,N,Code,Ctx", `201,ST-9,1.5,1.5,FL,${c}`].join("\n");
    const done = await call(
      importRoute,
      "POST",
      { siteId: fx.site.id },
      {
        csv,
        mapping: { number: "Find no", stationPoint: "Pt", x: "E", y: "N", classCode: "Code", contextNumber: "Ctx" },
      },
    );
    expect(done.status).toBe(201);
    const db = await getDb();
    const [row] = await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id));
    expect([row.number, row.stationPoint]).toEqual([201, "ST-9"]);
  });
});
