import { mkdtemp } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import sharp from "sharp";

import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { storeUploadedPhoto } from "@/lib/server/photos";
import { applyFit } from "@/lib/geometry/photo-fit";
import * as photosRoute from "@/app/api/sites/[siteId]/photos/route";
import * as photoRoute from "@/app/api/sites/[siteId]/photos/[photoId]/route";
import * as fitRoute from "@/app/api/sites/[siteId]/photos/[photoId]/fit/route";
import * as fileRoute from "@/app/api/files/[siteId]/[photoId]/[variant]/route";

/** Calls the file route and returns status, type and bytes (it answers with an image, not JSON). */
async function getFile(params: Record<string, string>) {
  const res = await fileRoute.GET(new Request("http://localhost/api/files"), { params: Promise.resolve(params) });
  return { status: res.status, type: res.headers.get("content-type"), bytes: Buffer.from(await res.arrayBuffer()) };
}

/** A 300 × 200 JPEG whose EXIF says "rotate 90° clockwise to view" (orientation 6, EXIF 2.32 §4.6.4). */
async function orientedJpeg() {
  return sharp({ create: { width: 300, height: 200, channels: 3, background: { r: 150, g: 110, b: 70 } } })
    .jpeg()
    .withMetadata({ orientation: 6 })
    .toBuffer();
}

let fx: SiteFixture;
let other: SiteFixture;
let photoId: string;
const fileKey = `k-${Date.now()}`;

beforeAll(async () => {
  const dir = await mkdtemp(path.join(os.tmpdir(), "loamwork-files-"));
  process.env.LOAMWORK_FILES_DIR = dir;
  await getDb();
  fx = await makeSite();
  other = await makeSite();
  const photo = await storeUploadedPhoto(await getDb(), {
    siteId: fx.site.id,
    trenchId: fx.trench.id,
    userId: fx.people.digger.id,
    fileKey,
    fileName: "trench-a.jpg",
    mimeType: "image/jpeg",
    bytes: await orientedJpeg(),
  });
  photoId = photo.id;
});

describe("derivatives made when an upload completes", () => {
  it("applies the EXIF orientation: a 300 × 200 photo tagged orientation 6 becomes 200 × 300", async () => {
    session.userId = fx.people.digger.id;
    const res = await call(photoRoute, "GET", { siteId: fx.site.id, photoId });
    expect(res.status).toBe(200);
    expect([res.json.width, res.json.height]).toEqual([200, 300]);
    const display = await getFile({ siteId: fx.site.id, photoId, variant: "display" });
    expect(display.type).toBe("image/jpeg");
    const meta = await sharp(display.bytes).metadata();
    expect([meta.width, meta.height]).toEqual([200, 300]);
    const thumb = await sharp((await getFile({ siteId: fx.site.id, photoId, variant: "thumb" })).bytes).metadata();
    expect(Math.max(thumb.width!, thumb.height!)).toBe(320);
  });

  it("refuses bytes that are not an image, saying why", async () => {
    await expect(
      storeUploadedPhoto(await getDb(), {
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        userId: fx.people.digger.id,
        fileKey: "k-text",
        fileName: "notes.jpg",
        mimeType: "image/jpeg",
        bytes: Buffer.from("context sheet notes, not a photo"),
      }),
    ).rejects.toThrow(/not an image Loamwork can read/);
  });
});

describe("photo routes and file access", () => {
  it("lists the trench's photos for members and hides them from strangers", async () => {
    session.userId = fx.people.specialist.id;
    const ok = await call(photosRoute, "GET", { siteId: fx.site.id }, undefined, { trenchId: fx.trench.id });
    expect(ok.status).toBe(200);
    expect(ok.json.map((p: { id: string }) => p.id)).toContain(photoId);
    session.userId = fx.people.stranger.id;
    expect((await call(photosRoute, "GET", { siteId: fx.site.id })).status).toBe(404);
  });

  it("serves files to members only: stranger 404, signed out 401, another site's id 404", async () => {
    session.userId = fx.people.specialist.id;
    expect((await getFile({ siteId: fx.site.id, photoId, variant: "display" })).status).toBe(200);
    session.userId = fx.people.stranger.id;
    expect((await getFile({ siteId: fx.site.id, photoId, variant: "display" })).status).toBe(404);
    session.userId = null;
    expect((await getFile({ siteId: fx.site.id, photoId, variant: "display" })).status).toBe(401);
    // A member of another site cannot reach this photo through their own site's path.
    session.userId = other.people.director.id;
    expect((await getFile({ siteId: other.site.id, photoId, variant: "display" })).status).toBe(404);
    session.userId = fx.people.digger.id;
    expect((await getFile({ siteId: fx.site.id, photoId, variant: "warp" })).status).toBe(404);
  });

  it("fits with four points (projective), stores residuals and makes a warped raster", async () => {
    session.userId = fx.people.digger.id;
    // Corners of the 200 × 300 display photo on a 4 × 6 m patch of grid, photo y down → grid y up.
    const points = [
      { px: 0, py: 0, x: 10, y: 26 },
      { px: 200, py: 0, x: 14, y: 26 },
      { px: 200, py: 300, x: 14, y: 20 },
      { px: 0, py: 300, x: 10, y: 20 },
      { px: 100, py: 150, x: 12.01, y: 23 },
    ];
    const res = await call(fitRoute, "POST", { siteId: fx.site.id, photoId }, { points });
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    expect(res.json.fit.model).toBe("projective");
    expect(res.json.fit.residuals).toHaveLength(5);
    expect(res.json.fit.rms).toBeGreaterThan(0);
    expect(res.json.fit.rms).toBeLessThan(0.01);
    const [x, y] = applyFit(res.json.fit.matrix, 100, 150);
    expect(Math.hypot(x - 12.01, y - 23)).toBeCloseTo(res.json.fit.residuals[4], 9);
    expect(res.json.fit.warp).toMatchObject({ url: `/api/files/${fx.site.id}/${photoId}/warp` });
    expect(res.json.fit.warp.minX).toBeCloseTo(10, 1);
    expect(res.json.fit.warp.maxY).toBeCloseTo(26, 1);
    const warp = await getFile({ siteId: fx.site.id, photoId, variant: "warp" });
    expect(warp.type).toBe("image/png");
    expect((await sharp(warp.bytes).metadata()).hasAlpha).toBe(true);
  });

  it("refuses collinear control points with the reason as a field error", async () => {
    session.userId = fx.people.digger.id;
    const points = [
      { px: 0, py: 0, x: 0, y: 0 },
      { px: 50, py: 50, x: 1, y: 0 },
      { px: 100, py: 100, x: 0, y: 1 },
    ];
    const res = await call(fitRoute, "POST", { siteId: fx.site.id, photoId }, { points });
    expect(res.status).toBe(400);
    expect(res.json.fieldErrors.points[0]).toMatch(/collinear/);
    expect(res.json.details.points).toEqual([0, 1, 2]);
  });

  it("refuses a point off the photo", async () => {
    session.userId = fx.people.digger.id;
    const res = await call(
      fitRoute,
      "POST",
      { siteId: fx.site.id, photoId },
      {
        points: [
          { px: 0, py: 0, x: 0, y: 0 },
          { px: 900, py: 10, x: 4, y: 0 },
        ],
      },
    );
    expect(res.status).toBe(400);
    expect(res.json.error).toMatch(/Point 2 is off the photo/);
  });

  it("deletes the photo and its files", async () => {
    session.userId = fx.people.director.id;
    expect((await call(photoRoute, "DELETE", { siteId: fx.site.id, photoId })).status).toBe(200);
    expect((await getFile({ siteId: fx.site.id, photoId, variant: "display" })).status).toBe(404);
    expect((await call(photoRoute, "GET", { siteId: fx.site.id, photoId })).status).toBe(404);
    // The trail names the file and the photo, not the upload service's key (a capability for the original).
    const trail = await (
      await getDb()
    )
      .select()
      .from(schema.auditEntries)
      .where(eq(schema.auditEntries.recordId, photoId));
    expect(trail.map((e) => e.action).sort()).toEqual(["create", "delete", "fit"]);
    expect(trail.find((e) => e.action === "delete")!.before).toMatchObject({
      id: photoId,
      fileName: "trench-a.jpg",
      mimeType: "image/jpeg",
    });
    expect(JSON.stringify(trail)).not.toContain(fileKey);
  });
});
