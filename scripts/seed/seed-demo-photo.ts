import { and, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import * as s from "@/db/schema";
import { makeDerivatives } from "@/lib/server/uploads/derivatives";
import { photoFolder, saveFile } from "@/lib/server/uploads/file-store";
import { seededPhotoKey } from "@/lib/server/uploads/remote";
import { DEMO_SEED, DEMO_SITE_CODE, DEMO_USERS } from "./seed-demo";
import { demoTrenchPhoto } from "./demo-photo";

/**
 * Adds the demo's synthetic, grid-fitted photo under trench A, once. It goes through the same derivative
 * step and file store as an uploaded photo, so the plan shows it exactly as it would show a real one.
 */
export async function seedDemoPhoto(db: Db): Promise<boolean> {
  const [site] = await db.select().from(s.sites).where(eq(s.sites.code, DEMO_SITE_CODE));
  if (!site) throw new Error("seed the demo site first");
  const [trench] = await db
    .select()
    .from(s.trenches)
    .where(and(eq(s.trenches.siteId, site.id), eq(s.trenches.code, "A")));
  const [already] = await db
    .select({ id: s.photos.id })
    .from(s.photos)
    .where(eq(s.photos.trenchId, trench.id))
    .limit(1);
  if (already) return false;
  const [digger] = await db.select().from(s.users).where(eq(s.users.email, DEMO_USERS[0].email));
  const [outer, ...holes] = trench.outline.coordinates;
  const bb = outer.reduce(
    (b, [x, y]) => ({ x0: Math.min(b.x0, x), y0: Math.min(b.y0, y), x1: Math.max(b.x1, x), y1: Math.max(b.y1, y) }),
    { x0: Infinity, y0: Infinity, x1: -Infinity, y1: -Infinity },
  );
  const pegs: [number, number][] = [
    [Math.floor(bb.x0) - 0.5, Math.floor(bb.y0) - 0.5],
    [Math.ceil(bb.x1) + 0.5, Math.floor(bb.y0) - 0.5],
    [Math.ceil(bb.x1) + 0.5, Math.ceil(bb.y1) + 0.5],
    [Math.floor(bb.x0) - 0.5, Math.ceil(bb.y1) + 0.5],
  ];
  const photo = await demoTrenchPhoto(outer, holes, pegs, DEMO_SEED, digger.id);
  const d = await makeDerivatives(photo.jpeg);
  const id = crypto.randomUUID();
  const folder = photoFolder(site.id, id);
  await saveFile(`${folder}/display.jpg`, d.display);
  await saveFile(`${folder}/thumb.jpg`, d.thumb);
  await db.insert(s.photos).values({
    id,
    siteId: site.id,
    trenchId: trench.id,
    fileKey: seededPhotoKey(id),
    fileName: photo.fileName,
    mimeType: "image/jpeg",
    width: d.width,
    height: d.height,
    displayPath: `${folder}/display.jpg`,
    thumbPath: `${folder}/thumb.jpg`,
    fit: photo.fit,
    uploadedBy: digger.id,
  });
  return true;
}
