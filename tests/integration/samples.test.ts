import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import Papa from "papaparse";
import { session, call } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { createFind } from "@/lib/server/finds";
import { createSample } from "@/lib/server/samples";
import { loadSiteActor } from "@/lib/server/membership";
import * as samplesRoute from "@/app/api/sites/[siteId]/samples/route";
import * as sampleRoute from "@/app/api/sites/[siteId]/samples/[sampleId]/route";
import * as statusRoute from "@/app/api/sites/[siteId]/samples/status/route";
import * as exportRoute from "@/app/api/sites/[siteId]/export/samples/route";
import * as siteRoute from "@/app/api/sites/[siteId]/route";

const bulk = (contextId: string) => ({ contextId, type: "bulk" as const, purpose: "flotation", volumeL: 40 });

describe("sample numbers", () => {
  it("hands out 1..N once each, without gaps, in the samples' own sequence while finds keep theirs", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const actors = await Promise.all(
      [fx.people.digger, fx.people.director].map((p) => loadSiteActor(db, p.id, fx.site.id)),
    );
    const N = 40;
    // Every fifth call names a spit the context does not have: refused, and its number goes back.
    const results = await Promise.allSettled(
      Array.from({ length: N }, (_, i) =>
        i % 5 === 4
          ? createSample(db, actors[i % 2]!, { ...bulk(fx.context.id), spit: 9 })
          : i % 2
            ? createSample(db, actors[i % 2]!, bulk(fx.context.id))
            : createFind(db, actors[i % 2]!, {
                contextId: fx.context.id,
                classId: fx.cls.id,
                x: 1,
                y: 1,
                description: "",
                method: "typed",
              }),
      ),
    );
    expect(results.filter((r) => r.status === "rejected")).toHaveLength(8);
    const rows = await db.select().from(schema.samples).where(eq(schema.samples.siteId, fx.site.id));
    expect(rows.map((s) => s.number).sort((a, b) => a - b)).toEqual(Array.from({ length: 16 }, (_, i) => i + 1));
    const finds = await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id));
    expect(finds.map((f) => f.number).sort((a, b) => a - b)).toEqual(Array.from({ length: 16 }, (_, i) => i + 1));
  });

  it("shares the finds' sequence when the site says so: each number is a find or a sample, never both, none skipped", async () => {
    const fx = await makeSite();
    const db = await getDb();
    session.userId = fx.people.director.id;
    const set = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { samplesShareFindNumbers: true });
    expect(set.status, JSON.stringify(set.json)).toBe(200);
    const actor = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
    await Promise.all(
      Array.from({ length: 30 }, (_, i) =>
        i % 3 === 0
          ? createSample(db, actor, bulk(fx.context.id))
          : createFind(db, actor, {
              contextId: fx.context.id,
              classId: fx.cls.id,
              x: 2,
              y: 1,
              description: "",
              method: "typed",
            }),
      ),
    );
    const s = (await db.select().from(schema.samples).where(eq(schema.samples.siteId, fx.site.id))).map(
      (r) => r.number,
    );
    const f = (await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id))).map((r) => r.number);
    expect(s).toHaveLength(10);
    expect([...s, ...f].sort((a, b) => a - b)).toEqual(Array.from({ length: 30 }, (_, i) => i + 1));
    const [site] = await db.select().from(schema.sites).where(eq(schema.sites.id, fx.site.id));
    expect(site!.nextFindNumber).toBe(31);
    expect(site!.nextSampleNumber).toBe(1);
  });

  it("fixes the numbering once a sample exists, and never hands a deleted sample's number out again", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const a = await call(samplesRoute, "POST", { siteId: fx.site.id }, bulk(fx.context.id));
    const b = await call(samplesRoute, "POST", { siteId: fx.site.id }, bulk(fx.context.id));
    expect([a.json.number, b.json.number]).toEqual([1, 2]);
    const del = await call(
      sampleRoute,
      "DELETE",
      { siteId: fx.site.id, sampleId: b.json.id },
      { reason: "bagged twice" },
    );
    expect(del.status, JSON.stringify(del.json)).toBe(200);
    const c = await call(samplesRoute, "POST", { siteId: fx.site.id }, bulk(fx.context.id));
    expect(c.json.number).toBe(3);
    const db = await getDb();
    const [audit] = await db
      .select()
      .from(schema.auditEntries)
      .where(and(eq(schema.auditEntries.recordId, b.json.id), eq(schema.auditEntries.action, "delete")));
    expect(audit!.reason).toBe("bagged twice");
    session.userId = fx.people.director.id;
    const change = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { samplesShareFindNumbers: true });
    expect(change.status).toBe(409);
    expect(change.json.error).toContain(
      "Sample numbering is fixed once samples are recorded: this site has 2 samples numbered in their own sequence",
    );
  });
});

describe("the sample sheet", () => {
  it("records where and how a sample was taken, with the spit by its number, the taker defaulting to the recorder", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db
      .insert(schema.spits)
      .values({ siteId: fx.site.id, contextId: fx.context.id, number: 2, topLevel: 49.4, baseLevel: 49.3 });
    session.userId = fx.people.digger.id;
    const res = await call(
      samplesRoute,
      "POST",
      { siteId: fx.site.id },
      {
        contextId: fx.context.id,
        type: "charcoal",
        spit: 2,
        x: "1.250",
        y: 3,
        z: 49.35,
        purpose: "radiocarbon",
        takenOn: "2026-07-02",
      },
    );
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    expect(res.json).toMatchObject({
      number: 1,
      type: "charcoal",
      spit: 2,
      x: 1.25,
      y: 3,
      z: 49.35,
      volumeL: null,
      takenBy: fx.people.digger.id,
      takenOn: "2026-07-02",
      status: "taken",
      trenchId: fx.trench.id,
    });
    const read = await call(sampleRoute, "GET", { siteId: fx.site.id, sampleId: res.json.id });
    expect(read.json.spit).toBe(2);
  });

  it("refuses bad input naming the field, writing nothing", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const cases: [unknown, string, string][] = [
      [{ ...bulk(fx.context.id), volumeL: -2 }, "volumeL", "A volume is more than 0 litres."],
      [{ ...bulk(fx.context.id), type: "soil" }, "type", "Pick the kind of sample"],
      [{ ...bulk(fx.context.id), x: 1 }, "y", "Give both x and y, or neither."],
      [{ ...bulk(fx.context.id), takenOn: "2026-02-30x" }, "takenOn", "Give the date as YYYY-MM-DD."],
      [{ ...bulk(fx.context.id), x: 20, y: 1 }, "x", "lies 10.000 m outside the outline of trench A"],
      [{ ...bulk(fx.context.id), spit: 4 }, "spit", `Context ${fx.context.number} has no spit 4.`],
      [{ ...bulk(fx.context.id), takenBy: fx.people.stranger.id }, "takenBy", "Pick a member of this site."],
    ];
    for (const [body, field, message] of cases) {
      const res = await call(samplesRoute, "POST", { siteId: fx.site.id }, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.json.fieldErrors[field].join(" ")).toContain(message);
    }
    const db = await getDb();
    expect(await db.select().from(schema.samples).where(eq(schema.samples.siteId, fx.site.id))).toEqual([]);
    const noReason = await call(
      sampleRoute,
      "DELETE",
      { siteId: fx.site.id, sampleId: "00000000-0000-4000-8000-000000000000" },
      {},
    );
    expect(noReason.status).toBe(400);
    expect(Object.keys(noReason.json.fieldErrors)).toEqual(["reason"]);
  });

  it("sets processing status in bulk, all or nothing, one audit entry per sample changed, even after sign-off", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const ids: string[] = [];
    for (let i = 0; i < 3; i++)
      ids.push((await call(samplesRoute, "POST", { siteId: fx.site.id }, bulk(fx.context.id))).json.id);
    const db = await getDb();
    await db
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffAt: new Date(), signedOffBy: fx.people.director.id })
      .where(eq(schema.contexts.id, fx.context.id));
    session.userId = fx.people.specialist.id;
    const other = await makeSite();
    const [foreign] = await db
      .insert(schema.samples)
      .values({
        siteId: other.site.id,
        trenchId: other.trench.id,
        contextId: other.context.id,
        number: 1,
        type: "spot",
        takenOn: "2026-07-01",
      })
      .returning();
    const mixed = await call(
      statusRoute,
      "POST",
      { siteId: fx.site.id },
      { sampleIds: [...ids, foreign!.id], status: "processed" },
    );
    expect(mixed.status).toBe(404);
    expect(mixed.json.error).toContain(foreign!.id);
    expect(
      (await db.select().from(schema.samples).where(eq(schema.samples.siteId, fx.site.id))).map((s) => s.status),
    ).toEqual(["taken", "taken", "taken"]);
    const done = await call(
      statusRoute,
      "POST",
      { siteId: fx.site.id },
      { sampleIds: ids.slice(0, 2), status: "processed" },
    );
    expect(done.json).toEqual({ changed: 2, status: "processed" });
    const entries = await db
      .select()
      .from(schema.auditEntries)
      .where(and(eq(schema.auditEntries.siteId, fx.site.id), eq(schema.auditEntries.action, "status")));
    expect(entries.map((e) => e.recordId).sort()).toEqual(ids.slice(0, 2).sort());
    expect(entries[0]!.after).toEqual({ status: "processed" });
  });

  it("exports the register as CSV with the filters, for members only", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    await call(samplesRoute, "POST", { siteId: fx.site.id }, { ...bulk(fx.context.id), purpose: "=HYPERLINK(1)" });
    await call(
      samplesRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: fx.context.id, type: "monolith", x: 2, y: 2, z: 49.125 },
    );
    const res = await exportRoute.GET(new Request(`http://localhost/api?type=monolith`), {
      params: Promise.resolve({ siteId: fx.site.id }),
    });
    expect(res.headers.get("content-type")).toContain("text/csv");
    const parsed = Papa.parse<Record<string, string>>(await res.text(), { header: true, skipEmptyLines: true });
    expect(parsed.data).toHaveLength(1);
    expect(parsed.data[0]).toMatchObject({
      number: "2",
      trench: "A",
      context: String(fx.context.number),
      type: "monolith",
      x: "2",
      y: "2",
      z_rl_m: "49.125",
      taken_by: "Digger",
      status: "taken",
      context_state: "open",
    });
    const all = await exportRoute.GET(new Request(`http://localhost/api`), {
      params: Promise.resolve({ siteId: fx.site.id }),
    });
    const rows = Papa.parse<Record<string, string>>(await all.text(), { header: true, skipEmptyLines: true }).data;
    // A formula typed into a cell is written inert (lib/csv-cells.ts).
    expect(rows[0]!.purpose.startsWith("=")).toBe(false);
    session.userId = fx.people.stranger.id;
    const stranger = await exportRoute.GET(new Request(`http://localhost/api`), {
      params: Promise.resolve({ siteId: fx.site.id }),
    });
    expect(stranger.status).toBe(404);
    const list = await call(samplesRoute, "GET", { siteId: fx.site.id });
    expect(list.status).toBe(404);
  });
});
