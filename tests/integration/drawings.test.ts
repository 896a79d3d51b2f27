import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import Papa from "papaparse";
import { session, call } from "../support/harness";
import { makeSite, squareWithBaulk } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as drawingsRoute from "@/app/api/sites/[siteId]/drawings/route";
import * as drawingRoute from "@/app/api/sites/[siteId]/drawings/[drawingId]/route";
import * as exportRoute from "@/app/api/sites/[siteId]/export/drawings/route";

describe("drawing register", () => {
  it("numbers drawings 1, 2, 3 … without gaps or repeats when recorded at the same moment", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const body = { kind: "plan", scale: 20, contextIds: [fx.context.id] };
    const answers = await Promise.all(
      Array.from({ length: 8 }, () => call(drawingsRoute, "POST", { siteId: fx.site.id }, body)),
    );
    expect(answers.map((a) => a.status)).toEqual(Array(8).fill(201));
    expect(answers.map((a) => a.json.number).sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    // A deleted drawing's number is not handed out again.
    const last = answers.find((a) => a.json.number === 8)!;
    const del = await call(
      drawingRoute,
      "DELETE",
      { siteId: fx.site.id, drawingId: last.json.id },
      { reason: "spoilt sheet" },
    );
    expect(del.status).toBe(200);
    const next = await call(drawingsRoute, "POST", { siteId: fx.site.id }, body);
    expect(next.json.number).toBe(9);
    const audit = await (
      await getDb()
    )
      .select()
      .from(schema.auditEntries)
      .where(eq(schema.auditEntries.recordId, last.json.id));
    expect(audit.map((a) => [a.action, a.recordType, a.reason])).toEqual([
      ["create", "drawing", null],
      ["delete", "drawing", "spoilt sheet"],
    ]);
  });

  it("refuses bad input naming the field, and contexts of two trenches, writing nothing", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [other] = await db
      .insert(schema.trenches)
      .values({ siteId: fx.site.id, code: "B", outline: squareWithBaulk })
      .returning();
    const [inB] = await db
      .insert(schema.contexts)
      .values({ siteId: fx.site.id, trenchId: other!.id, number: 9001, type: "fill" })
      .returning();
    session.userId = fx.people.director.id;
    const p = { siteId: fx.site.id };
    const noScale = await call(drawingsRoute, "POST", p, { kind: "plan", scale: "1:20", contextIds: [fx.context.id] });
    expect(noScale.status).toBe(400);
    expect(noScale.json.fieldErrors.scale[0]).toMatch(/scale/i);
    const none = await call(drawingsRoute, "POST", p, { kind: "elevation", scale: 20, contextIds: [] });
    expect(Object.keys(none.json.fieldErrors).sort()).toEqual(["contextIds", "kind"]);
    const twoTrenches = await call(drawingsRoute, "POST", p, {
      kind: "plan",
      scale: 20,
      contextIds: [fx.context.id, inB!.id],
    });
    expect(twoTrenches.status).toBe(400);
    expect(twoTrenches.json.fieldErrors.contextIds).toEqual(["Pick contexts of one trench."]);
    const drawnByStranger = await call(drawingsRoute, "POST", p, {
      kind: "plan",
      scale: 20,
      contextIds: [fx.context.id],
      drawnBy: fx.people.stranger.id,
    });
    expect(drawnByStranger.status).toBe(400);
    expect(drawnByStranger.json.fieldErrors.drawnBy).toEqual(["Pick a member of this site."]);
    expect(await db.select().from(schema.drawings).where(eq(schema.drawings.siteId, fx.site.id))).toEqual([]);
  });

  it("lists and exports the register for members only, each drawing with its contexts and state", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const made = await call(
      drawingsRoute,
      "POST",
      { siteId: fx.site.id },
      { kind: "section", scale: 10, contextIds: [fx.context.id], title: "=S1 east face" },
    );
    expect(made.status).toBe(201);
    session.userId = fx.people.specialist.id;
    const list = await call(drawingsRoute, "GET", { siteId: fx.site.id });
    expect(list.json.rows).toMatchObject([
      { number: 1, kind: "section", scale: 10, contextNumbers: [fx.context.number], state: "open", trenchCode: "A" },
    ]);
    const res = await exportRoute.GET(new Request("http://localhost/x"), {
      params: Promise.resolve({ siteId: fx.site.id }),
    });
    const rows = Papa.parse<Record<string, string>>(await res.text(), { header: true, skipEmptyLines: true }).data;
    expect(rows).toEqual([
      {
        number: "1",
        kind: "section",
        scale: "1:10",
        trench: "A",
        contexts: String(fx.context.number),
        title: "'=S1 east face",
        drawn_by: "Digger",
        drawn_on: new Date().toISOString().slice(0, 10),
        state: "open",
      },
    ]);
    session.userId = fx.people.stranger.id;
    expect((await call(drawingsRoute, "GET", { siteId: fx.site.id })).status).toBe(404);
    const strangerCsv = await exportRoute.GET(new Request("http://localhost/x"), {
      params: Promise.resolve({ siteId: fx.site.id }),
    });
    expect(strangerCsv.status).toBe(404);
  });
});
