/**
 * A photo upload end to end through the app's own file router and the uploadthing SDK's route handler,
 * against the local upload fake (production flow: the fake POSTs the callback to the app).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import sharp from "sharp";
import { eq } from "drizzle-orm";
import { UTApi } from "uploadthing/server";
import { session } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as fileRoute from "@/app/api/files/[siteId]/[photoId]/[variant]/route";
import { listPhotos } from "@/lib/server/photos";
import { FAKE_UPLOADTHING_TOKEN } from "@/lib/dev-services/upload-fake";
import { startUploadStack, type UploadStack } from "../support/upload-stack";

let fx: SiteFixture;
let stack: UploadStack;

beforeAll(async () => {
  stack = await startUploadStack();
  await getDb();
  fx = await makeSite();
});
afterAll(async () => {
  await stack?.close();
});

const requestUpload = (file: { name: string; size: number; type: string }, input: unknown) =>
  stack.requestUpload("trenchPhoto", file, input);
const put: UploadStack["put"] = (...a) => stack.put(...a);

/** Whether the stand-in still holds a file under that key (asked with the app's own credentials). */
async function heldAtService(key: string) {
  const { files } = await new UTApi({
    token: FAKE_UPLOADTHING_TOKEN,
    apiUrl: stack.fake.url,
    logLevel: "Error",
  }).listFiles();
  return files.some((f) => f.key === key);
}

async function getFile(params: Record<string, string>) {
  const res = await fileRoute.GET(new Request("http://localhost/api/files"), { params: Promise.resolve(params) });
  return { status: res.status, type: res.headers.get("content-type"), bytes: Buffer.from(await res.arrayBuffer()) };
}

describe("photo upload through the uploadthing route and the fake", () => {
  it("a digger's JPEG becomes a photo record with derivatives", async () => {
    session.userId = fx.people.digger.id;
    const bytes = await sharp({ create: { width: 640, height: 480, channels: 3, background: "#8a6a4a" } })
      .jpeg()
      .toBuffer();
    const presigned = await requestUpload(
      { name: "a-east.jpg", size: bytes.length, type: "image/jpeg" },
      { siteId: fx.site.id, trenchId: fx.trench.id },
    );
    expect(presigned.status, JSON.stringify(presigned.json)).toBe(200);
    const out = await put(presigned.json[0].url, bytes, "a-east.jpg", "image/jpeg");
    expect(out.error).toBeUndefined();
    expect(out.serverData.error).toBeNull();
    const photos = await listPhotos(await getDb(), fx.site.id, fx.trench.id);
    expect(photos.map((p) => p.id)).toContain(out.serverData.photoId);
    expect(photos.find((p) => p.id === out.serverData.photoId)).toMatchObject({
      fileName: "a-east.jpg",
      width: 640,
      height: 480,
    });
  });

  it("keeps the original private: not at the service's own URL, only through the member-checked route", async () => {
    session.userId = fx.people.digger.id;
    const bytes = await sharp({ create: { width: 320, height: 200, channels: 3, background: "#6a5a3a" } })
      .jpeg()
      .toBuffer();
    const presigned = await requestUpload(
      { name: "a-west.jpg", size: bytes.length, type: "image/jpeg" },
      { siteId: fx.site.id, trenchId: fx.trench.id },
    );
    const key: string = presigned.json[0].key;
    const out = await put(presigned.json[0].url, bytes, "a-west.jpg", "image/jpeg");
    const photoId: string = out.serverData.photoId;
    expect(photoId).toBeTruthy();
    // Signed out at the upload service, with the URL the upload reported: refused.
    expect((await fetch(out.ufsUrl)).status).toBe(403);
    expect((await fetch(`${stack.fake.url}/f/${encodeURIComponent(key)}`)).status).toBe(403);
    // A member gets the very bytes through the app; a stranger and a signed-out caller do not.
    const original = await getFile({ siteId: fx.site.id, photoId, variant: "original" });
    expect(original.status).toBe(200);
    expect(original.type).toBe("image/jpeg");
    expect(original.bytes.equals(bytes)).toBe(true);
    session.userId = fx.people.stranger.id;
    expect((await getFile({ siteId: fx.site.id, photoId, variant: "original" })).status).toBe(404);
    session.userId = null;
    expect((await getFile({ siteId: fx.site.id, photoId, variant: "original" })).status).toBe(401);
  });

  it("audits the file by name, size, type and photo id, never by the upload key", async () => {
    session.userId = fx.people.digger.id;
    const bytes = await sharp({ create: { width: 200, height: 100, channels: 3, background: "#4a3a2a" } })
      .jpeg()
      .toBuffer();
    const presigned = await requestUpload(
      { name: "a-north.jpg", size: bytes.length, type: "image/jpeg" },
      { siteId: fx.site.id, trenchId: fx.trench.id },
    );
    const key: string = presigned.json[0].key;
    const out = await put(presigned.json[0].url, bytes, "a-north.jpg", "image/jpeg");
    const [entry] = await (
      await getDb()
    )
      .select()
      .from(schema.auditEntries)
      .where(eq(schema.auditEntries.recordId, out.serverData.photoId));
    expect(entry.action).toBe("create");
    expect(entry.after).toMatchObject({
      id: out.serverData.photoId,
      fileName: "a-north.jpg",
      size: bytes.length,
      mimeType: "image/jpeg",
    });
    expect(JSON.stringify(entry)).not.toContain(key);
  });

  it("refuses a file that is not an image, naming the type", async () => {
    session.userId = fx.people.digger.id;
    const res = await requestUpload(
      { name: "sheet.pdf", size: 1200, type: "application/pdf" },
      { siteId: fx.site.id, trenchId: fx.trench.id },
    );
    expect(res.status).toBe(400);
    expect(res.json.message).toMatch(/sheet\.pdf.*application\/pdf.*not a photo/);
  });

  it("refuses a photo over the size limit, with the size and the limit", async () => {
    session.userId = fx.people.digger.id;
    const res = await requestUpload(
      { name: "huge.jpg", size: 40 * 1024 * 1024, type: "image/jpeg" },
      { siteId: fx.site.id, trenchId: fx.trench.id },
    );
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(res.json.message).toMatch(/40\.0 MB.*limit.*16 MB/);
  });

  it("refuses a specialist (role) and a stranger (not found), and a signed-out caller", async () => {
    const input = { siteId: fx.site.id, trenchId: fx.trench.id };
    const file = { name: "a.jpg", size: 100, type: "image/jpeg" };
    session.userId = fx.people.specialist.id;
    const spec = await requestUpload(file, input);
    expect(spec.status).toBe(403);
    expect(spec.json.message).toMatch(/specialist cannot upload plan photos/);
    session.userId = fx.people.stranger.id;
    expect((await requestUpload(file, input)).status).toBe(404);
    session.userId = null;
    expect((await requestUpload(file, input)).status).toBe(403);
  });

  it("reports bytes that claim to be a JPEG but are not, without recording a photo", async () => {
    session.userId = fx.people.digger.id;
    const before = (await listPhotos(await getDb(), fx.site.id)).length;
    const bytes = Buffer.from("this is a context sheet, typed up");
    const presigned = await requestUpload(
      { name: "fake.jpg", size: bytes.length, type: "image/jpeg" },
      { siteId: fx.site.id, trenchId: fx.trench.id },
    );
    const out = await put(presigned.json[0].url, bytes, "fake.jpg", "image/jpeg");
    expect(out.serverData.error).toMatch(/not an image/);
    expect((await listPhotos(await getDb(), fx.site.id)).length).toBe(before);
    // Refused, so deleted at the upload service too.
    expect(await heldAtService(presigned.json[0].key)).toBe(false);
  });
});
