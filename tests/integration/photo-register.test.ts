/**
 * The photo register (issue 15 item 2): record photos of contexts, finds and trenches uploaded through the
 * uploadthing route and the local fake, numbered per site without gaps, dated from EXIF, served to members
 * only, locked with what they are of.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import sharp from "sharp";
import Papa from "papaparse";
import { and, eq } from "drizzle-orm";
import { call, session } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { startUploadStack, type UploadStack } from "../support/upload-stack";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as fileRoute from "@/app/api/files/[siteId]/[photoId]/[variant]/route";
import * as registerRoute from "@/app/api/sites/[siteId]/record-photos/route";
import * as recordPhotoRoute from "@/app/api/sites/[siteId]/record-photos/[photoId]/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";
import * as planPhotoRoute from "@/app/api/sites/[siteId]/photos/[photoId]/route";
import { listPhotos } from "@/lib/server/photos";
import { packagePhotos, photosRegister } from "@/lib/server/export/package-registers";

let stack: UploadStack;
let fx: SiteFixture;

beforeAll(async () => {
  stack = await startUploadStack();
  await getDb();
  fx = await makeSite();
});
afterAll(async () => {
  await stack?.close();
});

/** A small JPEG; with `taken`, carrying EXIF DateTimeOriginal (and its offset) as a camera writes them. */
async function jpeg(colour: string, taken?: { stamp: string; offset?: string }) {
  const img = sharp({ create: { width: 480, height: 360, channels: 3, background: colour } }).jpeg();
  if (!taken) return img.toBuffer();
  return img
    .withExif({
      IFD0: { Make: "Loamwork test camera" },
      IFD2: { DateTimeOriginal: taken.stamp, ...(taken.offset && { OffsetTimeOriginal: taken.offset }) },
    })
    .toBuffer();
}

type Sheet = { subject: "context" | "find" | "trench"; subjectId: string; scale?: string; [k: string]: unknown };

/** One upload end to end as `userId`: presign (middleware), PUT to the fake, callback; the fake's answer. */
async function upload(
  site: SiteFixture,
  bytes: Buffer,
  sheet: Sheet,
  opts: { name?: string; key?: string } = {},
): Promise<{ status: number; json: any; out?: any }> {
  const name = opts.name ?? "photo.jpg";
  const presigned = await stack.requestUpload(
    "recordPhoto",
    { name, size: bytes.length, type: "image/jpeg" },
    { siteId: site.site.id, scale: "1 m", ...sheet },
    opts.key ? { "idempotency-key": opts.key } : {},
  );
  if (presigned.status !== 200) return presigned;
  const out = await stack.put(presigned.json[0].url, bytes, name, "image/jpeg");
  return { ...presigned, out };
}

async function getFile(siteId: string, photoId: string, variant: string) {
  const res = await fileRoute.GET(new Request("http://localhost/api/files"), {
    params: Promise.resolve({ siteId, photoId, variant }),
  });
  return { status: res.status, type: res.headers.get("content-type"), bytes: Buffer.from(await res.arrayBuffer()) };
}

const register = (site: SiteFixture, query: Record<string, string> = {}) =>
  call(registerRoute, "GET", { siteId: site.site.id }, undefined, query);

describe("adding record photos", () => {
  it("a digger's photo of a context gets the next number, its sheet, and the camera's date from EXIF", async () => {
    session.userId = fx.people.digger.id;
    const bytes = await jpeg("#7a5c3e", { stamp: "2026:07:14 09:30:05", offset: "+02:00" });
    const res = await upload(
      fx,
      bytes,
      { subject: "context", subjectId: fx.context.id, facing: "NE", scale: "1 m", caption: "Hearth, half-sectioned" },
      { name: "hearth.jpg" },
    );
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    expect(res.out.serverData.error).toBeNull();
    const list = await register(fx, { contextId: fx.context.id });
    expect(list.status).toBe(200);
    expect(list.json.rows).toHaveLength(1);
    expect(list.json.rows[0]).toMatchObject({
      id: res.out.serverData.photoId,
      number: 1,
      subject: "context",
      contextNumber: fx.context.number,
      trenchCode: "A",
      facing: 45,
      scale: "1 m",
      caption: "Hearth, half-sectioned",
      takenById: fx.people.digger.id,
      // 09:30:05 at +02:00 is 07:30:05 UTC.
      takenAt: "2026-07-14T07:30:05.000Z",
      takenAtSource: "camera",
      fileName: "hearth.jpg",
      width: 480,
      height: 360,
      locked: false,
    });
  });

  it("a camera stamp without an offset is read as UTC; a file without EXIF is dated by its upload, and says so", async () => {
    session.userId = fx.people.director.id;
    const stamped = await upload(fx, await jpeg("#5a4a3a", { stamp: "2025:08:01 16:05:00" }), {
      subject: "trench",
      subjectId: fx.trench.id,
      facing: 200,
    });
    const before = Date.now();
    const plain = await upload(fx, await jpeg("#4a3a2a"), { subject: "trench", subjectId: fx.trench.id });
    const rows = (await register(fx, { trenchId: fx.trench.id })).json.rows as any[];
    const a = rows.find((r) => r.id === stamped.out.serverData.photoId);
    const b = rows.find((r) => r.id === plain.out.serverData.photoId);
    expect(a).toMatchObject({ takenAt: "2025-08-01T16:05:00.000Z", takenAtSource: "camera", facing: 200 });
    expect(b.takenAtSource).toBe("upload");
    expect(Date.parse(b.takenAt)).toBeGreaterThanOrEqual(before - 1000);
    expect(Date.parse(b.takenAt)).toBeLessThanOrEqual(Date.now());
  });

  it("parallel uploads get distinct numbers with no gap", async () => {
    const site = await makeSite();
    session.userId = site.people.digger.id;
    const results = await Promise.all(
      Array.from({ length: 6 }, async (_, i) =>
        upload(site, await jpeg(`#${(0x404040 + i * 0x0a0a0a).toString(16)}`), {
          subject: "context",
          subjectId: site.context.id,
        }),
      ),
    );
    for (const r of results) expect(r.out?.serverData ? r.out.serverData.error : "no answer").toBeNull();
    const numbers = results.map((r) => r.out.serverData.number as number).sort((x, y) => x - y);
    expect(numbers).toEqual([1, 2, 3, 4, 5, 6]);
    const stored = await (
      await getDb()
    )
      .select({ n: schema.photos.number })
      .from(schema.photos)
      .where(eq(schema.photos.siteId, site.site.id));
    expect(stored.map((r) => r.n).sort((x, y) => x! - y!)).toEqual([1, 2, 3, 4, 5, 6]);
  });

  it("an upload replayed with the same idempotency key records one photo", async () => {
    const site = await makeSite();
    session.userId = site.people.digger.id;
    const key = crypto.randomUUID();
    const bytes = await jpeg("#6b4f2f");
    const first = await upload(site, bytes, { subject: "context", subjectId: site.context.id }, { key });
    const again = await upload(site, bytes, { subject: "context", subjectId: site.context.id }, { key });
    expect(again.out.serverData.photoId).toBe(first.out.serverData.photoId);
    expect((await register(site)).json.total).toBe(1);
  });

  it("refuses a bad sheet naming the field, a specialist, a stranger and a signed-out caller, before any byte", async () => {
    const file = { name: "a.jpg", size: 100, type: "image/jpeg" };
    const input = { siteId: fx.site.id, subject: "context", subjectId: fx.context.id, scale: "1 m" };
    session.userId = fx.people.digger.id;
    const bad = await stack.requestUpload("recordPhoto", file, { ...input, facing: 400 });
    expect(bad.status).toBe(400);
    expect(bad.json.message).toMatch(/facing/);
    expect(bad.json.fieldErrors.facing[0]).toMatch(/0 to 359/);
    const noScale = await stack.requestUpload("recordPhoto", file, { ...input, scale: "" });
    expect(noScale.json.fieldErrors.scale[0]).toMatch(/scale/);
    session.userId = fx.people.specialist.id;
    const spec = await stack.requestUpload("recordPhoto", file, input);
    expect(spec.status).toBe(403);
    expect(spec.json.message).toMatch(/specialist cannot add record photos/);
    session.userId = fx.people.stranger.id;
    expect((await stack.requestUpload("recordPhoto", file, input)).status).toBe(404);
    session.userId = null;
    expect((await stack.requestUpload("recordPhoto", file, input)).status).toBe(403);
  });
});

describe("files for members only", () => {
  it("serves the thumbnail, display copy and original to members; strangers get 404, signed-out callers 401", async () => {
    session.userId = fx.people.digger.id;
    const bytes = await jpeg("#8a6a4a");
    const res = await upload(fx, bytes, { subject: "context", subjectId: fx.context.id });
    const photoId: string = res.out.serverData.photoId;
    session.userId = fx.people.specialist.id;
    const thumb = await getFile(fx.site.id, photoId, "thumb");
    expect(thumb.status).toBe(200);
    expect(thumb.type).toBe("image/jpeg");
    expect((await sharp(thumb.bytes).metadata()).width).toBe(320);
    expect((await getFile(fx.site.id, photoId, "display")).status).toBe(200);
    const original = await getFile(fx.site.id, photoId, "original");
    expect(original.bytes.equals(bytes)).toBe(true);
    session.userId = fx.people.stranger.id;
    expect((await getFile(fx.site.id, photoId, "thumb")).status).toBe(404);
    expect((await getFile(fx.site.id, photoId, "original")).status).toBe(404);
    session.userId = null;
    expect((await getFile(fx.site.id, photoId, "thumb")).status).toBe(401);
  });
});

describe("the register beside the plan underlays", () => {
  it("keeps record photos out of the plan's underlays and out of reach of the underlay routes", async () => {
    session.userId = fx.people.digger.id;
    const res = await upload(fx, await jpeg("#3a2a1a"), { subject: "trench", subjectId: fx.trench.id });
    const photoId: string = res.out.serverData.photoId;
    expect((await listPhotos(await getDb(), fx.site.id, fx.trench.id)).map((p) => p.id)).not.toContain(photoId);
    session.userId = fx.people.director.id;
    const del = await call(planPhotoRoute, "DELETE", { siteId: fx.site.id, photoId });
    expect(del.status).toBe(404);
    expect((await register(fx)).json.rows.map((r: any) => r.id)).toContain(photoId);
  });

  it("a photo of a find belongs to the find's trench; filters select by trench, context and find", async () => {
    const db = await getDb();
    const [find] = await db
      .insert(schema.finds)
      .values({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        contextId: fx.context.id,
        classId: fx.cls.id,
        number: 4242,
        x: 1,
        y: 1,
        method: "plan",
      })
      .returning();
    session.userId = fx.people.digger.id;
    const res = await upload(fx, await jpeg("#2a3a4a"), { subject: "find", subjectId: find!.id, scale: "10 cm" });
    const byFind = (await register(fx, { findId: find!.id })).json.rows;
    expect(byFind).toHaveLength(1);
    expect(byFind[0]).toMatchObject({ id: res.out.serverData.photoId, subject: "find", findNumber: 4242 });
    expect(byFind[0].trenchCode).toBe("A");
    const byTrench = (await register(fx, { trenchId: fx.trench.id })).json.rows.map((r: any) => r.id);
    expect(byTrench).toContain(res.out.serverData.photoId);
    const byContext = (await register(fx, { contextId: fx.context.id })).json.rows.map((r: any) => r.id);
    expect(byContext).not.toContain(res.out.serverData.photoId);
  });

  it("edits the sheet, deletes with a reason in the audit trail, and never hands a deleted number out again", async () => {
    const site = await makeSite();
    session.userId = site.people.digger.id;
    const first = await upload(site, await jpeg("#605040"), { subject: "context", subjectId: site.context.id });
    const photoId: string = first.out.serverData.photoId;
    const edited = await call(
      recordPhotoRoute,
      "PATCH",
      { siteId: site.site.id, photoId },
      {
        caption: "Cut 1003 from the east",
        facing: "W",
        scale: "2 m",
      },
    );
    expect(edited.status, JSON.stringify(edited.json)).toBe(200);
    expect(edited.json).toMatchObject({ caption: "Cut 1003 from the east", facing: 270, scale: "2 m" });
    const bad = await call(recordPhotoRoute, "PATCH", { siteId: site.site.id, photoId }, { facing: "up" });
    expect(bad.status).toBe(400);
    expect(bad.json.fieldErrors.facing).toBeDefined();
    const noReason = await call(recordPhotoRoute, "DELETE", { siteId: site.site.id, photoId }, {});
    expect(noReason.status).toBe(400);
    const del = await call(recordPhotoRoute, "DELETE", { siteId: site.site.id, photoId }, { reason: "out of focus" });
    expect(del.status).toBe(200);
    expect(del.json).toEqual({ deleted: photoId, number: 1 });
    const [audit] = await (
      await getDb()
    )
      .select()
      .from(schema.auditEntries)
      .where(and(eq(schema.auditEntries.recordId, photoId), eq(schema.auditEntries.action, "delete")));
    expect(audit!.reason).toBe("out of focus");
    expect(JSON.stringify(audit)).not.toContain(first.json[0].key);
    expect((await getFile(site.site.id, photoId, "thumb")).status).toBe(404);
    const next = await upload(site, await jpeg("#504030"), { subject: "context", subjectId: site.context.id });
    expect(next.out.serverData.number).toBe(2);
  });
});

describe("locked with what the photo is of", () => {
  it("refuses a new photo of a submitted context and of a signed-off trench, and edits of their photos", async () => {
    const site = await makeSite();
    session.userId = site.people.digger.id;
    const before = await upload(site, await jpeg("#706050"), { subject: "context", subjectId: site.context.id });
    const ofTrench = await upload(site, await jpeg("#605050"), { subject: "trench", subjectId: site.trench.id });
    const db = await getDb();
    await db
      .update(schema.contexts)
      .set({ state: "awaiting", submittedAt: new Date(), submittedBy: site.people.digger.id })
      .where(eq(schema.contexts.id, site.context.id));
    await db
      .update(schema.trenches)
      .set({ signedOffAt: new Date(), signedOffBy: site.people.director.id })
      .where(eq(schema.trenches.id, site.trench.id));
    const refused = await stack.requestUpload(
      "recordPhoto",
      { name: "late.jpg", size: 100, type: "image/jpeg" },
      { siteId: site.site.id, subject: "context", subjectId: site.context.id, scale: "1 m" },
    );
    expect(refused.status).toBe(400);
    expect(refused.json).toMatchObject({ status: 409, reason: "locked" });
    expect(refused.json.message).toMatch(/submitted for sign-off.*cannot be given new photos/);
    const trenchRefused = await stack.requestUpload(
      "recordPhoto",
      { name: "late.jpg", size: 100, type: "image/jpeg" },
      { siteId: site.site.id, subject: "trench", subjectId: site.trench.id, scale: "1 m" },
    );
    expect(trenchRefused.json).toMatchObject({ status: 409, reason: "trench-locked" });
    session.userId = site.people.director.id;
    for (const id of [before.out.serverData.photoId, ofTrench.out.serverData.photoId]) {
      const edit = await call(recordPhotoRoute, "PATCH", { siteId: site.site.id, photoId: id }, { caption: "x" });
      expect(edit.status).toBe(409);
      const del = await call(recordPhotoRoute, "DELETE", { siteId: site.site.id, photoId: id }, { reason: "late" });
      expect(del.status).toBe(409);
    }
    const rows = (await register(site)).json.rows as any[];
    expect(rows.map((r) => [r.state, r.locked])).toEqual([
      ["awaiting", true],
      ["signed_off", true],
    ]);
  });

  it("a context locked between the presign and the upload's arrival records nothing", async () => {
    const site = await makeSite();
    session.userId = site.people.digger.id;
    const bytes = await jpeg("#807060");
    const presigned = await stack.requestUpload(
      "recordPhoto",
      { name: "race.jpg", size: bytes.length, type: "image/jpeg" },
      { siteId: site.site.id, subject: "context", subjectId: site.context.id, scale: "1 m" },
    );
    expect(presigned.status).toBe(200);
    await (
      await getDb()
    )
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffAt: new Date(), signedOffBy: site.people.director.id })
      .where(eq(schema.contexts.id, site.context.id));
    const out = await stack.put(presigned.json[0].url, bytes, "race.jpg", "image/jpeg");
    expect(out.serverData.error).toMatch(/signed off/);
    expect(out.serverData.photoId).toBeNull();
    expect((await register(site)).json.total).toBe(0);
    // The number went back with the rolled-back transaction.
    const [s] = await (await getDb()).select().from(schema.sites).where(eq(schema.sites.id, site.site.id));
    expect(s!.nextPhotoNumber).toBe(1);
  });
});

describe("records a photo is of", () => {
  it("a trench with a photo in the register cannot be deleted, and says which", async () => {
    const site = await makeSite();
    const db = await getDb();
    const [b] = await db
      .insert(schema.trenches)
      .values({ siteId: site.site.id, code: "B", outline: fx.trench.outline })
      .returning();
    session.userId = site.people.digger.id;
    await upload(site, await jpeg("#403020"), { subject: "trench", subjectId: b!.id });
    session.userId = site.people.director.id;
    const del = await call(trenchRoute, "DELETE", { siteId: site.site.id, trenchId: b!.id });
    expect(del.status).toBe(409);
    expect(del.json.error).toMatch(/Trench B has photo 1 in the photo register/);
  });
});

describe("the deposition package", () => {
  it("lists record photos in the photos register with their number, subject, sheet and state", async () => {
    const list = await packagePhotos(await getDb(), { siteId: fx.site.id, trenchId: fx.trench.id });
    const records = list.filter((p) => p.kind === "record");
    expect(records.length).toBeGreaterThanOrEqual(5);
    const reg = photosRegister(
      list,
      new Map(list.map((p) => [p.id, { path: `files/photos/${p.id}.jpg`, copy: "original" }])),
    );
    const rows = Papa.parse<Record<string, string>>(reg.csv, { header: true, skipEmptyLines: true }).data;
    const first = rows.find((r) => r.photo_number === "1")!;
    expect(first.photo_kind).toBe("record");
    expect(first.caption).toBe("Hearth, half-sectioned");
    expect(first.photo_of).toBe("context");
    expect(first.context).toBe(String(fx.context.number));
    expect(first.facing).toBe("NE");
    expect(first.scale_shown).toBe("1 m");
    expect(first.taken_at).toBe("2026-07-14T07:30:05.000Z");
    expect(first.taken_at_from).toBe("camera (EXIF)");
    expect(first.record_state).toBe("open");
  });
});
