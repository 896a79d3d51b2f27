import { existsSync } from "node:fs";
import { EventEmitter } from "node:events";
import { describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { call, session } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { packageFilePath } from "@/lib/server/export/package-writer";
import {
  KEEP_PACKAGES,
  RESUME_GRACE_MS,
  keepNotingDownload,
  prunePackages,
  recordDownload,
} from "@/lib/server/export/package-prune";
import { packagesIdle } from "@/lib/server/jobs/package-queue";
import { saveFile, storePath } from "@/lib/server/uploads/file-store";
import * as packagesRoute from "@/app/api/sites/[siteId]/packages/route";
import * as fileRoute from "@/app/api/sites/[siteId]/packages/[packageId]/file/route";

/** Old deposition packages' zips are removed once newer ones finish; the newest few and any being downloaded stay. */
async function finished(fx: SiteFixture, daysAgo: number, trenchId: string | null = null) {
  const db = await getDb();
  const at = new Date(Date.UTC(2026, 6, 20) - daysAgo * 86_400_000);
  const [row] = await db
    .insert(s.depositionPackages)
    .values({
      siteId: fx.site.id,
      trenchId,
      status: "done",
      createdBy: fx.people.director.id,
      createdAt: at,
      finishedAt: at,
    })
    .returning();
  const relative = packageFilePath(fx.site.id, row!.id);
  await saveFile(relative, Buffer.from(`zip of ${daysAgo} days ago `.repeat(100)));
  await db
    .update(s.depositionPackages)
    .set({ filePath: relative, fileName: `p${daysAgo}.zip`, bytes: 2_000, fingerprint: "f".repeat(64) })
    .where(eq(s.depositionPackages.id, row!.id));
  return { id: row!.id, file: storePath(relative) };
}
const download = (fx: SiteFixture, packageId: string) =>
  fileRoute.GET(new Request("http://localhost/x"), { params: Promise.resolve({ siteId: fx.site.id, packageId }) });
const filePathOf = async (id: string) =>
  (await (await getDb()).select().from(s.depositionPackages).where(eq(s.depositionPackages.id, id)))[0]!.filePath;

describe("pruning old deposition packages", () => {
  it(`keeps the newest ${KEEP_PACKAGES} whole-site zips and one still being downloaded; removes the rest`, async () => {
    const fx = await makeSite();
    const [p1, p2, p3, p4, p5] = [
      await finished(fx, 1),
      await finished(fx, 2),
      await finished(fx, 3),
      await finished(fx, 4),
      await finished(fx, 5),
    ];
    const other = await makeSite();
    const elsewhere = [
      await finished(other, 10),
      await finished(other, 11),
      await finished(other, 12),
      await finished(other, 13),
    ];
    session.userId = fx.people.director.id;
    // Package 4 is being downloaded: its stream is open.
    const reading = await download(fx, p4!.id);
    expect(reading.status).toBe(200);
    const now = Date.now();
    expect(await prunePackages(await getDb(), fx.site.id, now)).toEqual([p5!.id]);
    expect([p1, p2, p3, p4].map((p) => existsSync(p!.file))).toEqual([true, true, true, true]);
    expect(existsSync(p5!.file)).toBe(false);
    expect(await filePathOf(p5!.id)).toBeNull();
    // Another site's packages are its own.
    expect(elsewhere.every((p) => existsSync(p.file))).toBe(true);

    // The removed one says so, and the list shows it without a file.
    const gone = await download(fx, p5!.id);
    expect(gone.status).toBe(409);
    expect(((await gone.json()) as { error: string }).error).toBe(
      `This package's file was removed when newer ones were written: the newest ${KEEP_PACKAGES} packages of the whole site and of each trench are kept. Its fingerprint stays in the list; write a new package to download one.`,
    );
    const list = await call(packagesRoute, "GET", { siteId: fx.site.id });
    const byId = new Map((list.json as { id: string; fileKept: boolean; fingerprint: string }[]).map((p) => [p.id, p]));
    expect(byId.get(p5!.id)).toMatchObject({ fileKept: false, fingerprint: "f".repeat(64) });
    expect(byId.get(p4!.id)).toMatchObject({ fileKept: true });

    // The download ends; its file stays a while for a resumed (Range) download, then goes.
    expect((await reading.arrayBuffer()).byteLength).toBe("zip of 4 days ago ".length * 100);
    expect(await prunePackages(await getDb(), fx.site.id, Date.now())).toEqual([]);
    expect(await prunePackages(await getDb(), fx.site.id, Date.now() + RESUME_GRACE_MS + 1_000)).toEqual([p4!.id]);
    expect(existsSync(p4!.file)).toBe(false);
  });

  it(`keeps the newest ${KEEP_PACKAGES} of the whole site and of each trench apart`, async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [trenchB] = await db
      .insert(s.trenches)
      .values({ siteId: fx.site.id, code: "B", outline: fx.trench.outline })
      .returning();
    // Oldest first in each scope: the whole site's packages are older than every trench package.
    const whole = [await finished(fx, 20), await finished(fx, 21), await finished(fx, 22), await finished(fx, 23)];
    const trenchA = [];
    for (const daysAgo of [1, 2, 3, 4, 5]) trenchA.push(await finished(fx, daysAgo, fx.trench.id));
    const b = [await finished(fx, 6, trenchB!.id), await finished(fx, 7, trenchB!.id)];
    const pruned = await prunePackages(db, fx.site.id, Date.now());
    expect(new Set(pruned)).toEqual(new Set([whole[3]!.id, trenchA[3]!.id, trenchA[4]!.id]));
    expect(whole.map((p) => existsSync(p.file))).toEqual([true, true, true, false]);
    expect(trenchA.map((p) => existsSync(p.file))).toEqual([true, true, true, false, false]);
    expect(b.map((p) => existsSync(p.file))).toEqual([true, true]);
  });

  it("spares a zip whose download another server process noted, for the resume grace", async () => {
    const fx = await makeSite();
    const [, , , oldest] = [await finished(fx, 1), await finished(fx, 2), await finished(fx, 3), await finished(fx, 4)];
    const began = Date.now();
    // Process A, streaming the zip, notes the download; process B shares only the database with it.
    await recordDownload(await getDb(), fx.site.id, oldest!.id, new Date(began));
    const fresh = await getDb();
    expect(await prunePackages(fresh, fx.site.id, began + RESUME_GRACE_MS - 60_000)).toEqual([]);
    expect(existsSync(oldest!.file)).toBe(true);
    expect(await filePathOf(oldest!.id)).not.toBeNull();
    // Once the hour has passed with no further download, the next prune removes it.
    expect(await prunePackages(fresh, fx.site.id, began + RESUME_GRACE_MS + 1_000)).toEqual([oldest!.id]);
    expect(existsSync(oldest!.file)).toBe(false);
  });

  it("notes each download on the package's row, so no process has to remember it", async () => {
    const fx = await makeSite();
    const p = await finished(fx, 1);
    session.userId = fx.people.director.id;
    const before = Date.now();
    const reading = await download(fx, p.id);
    expect(reading.status).toBe(200);
    const noted = async () =>
      (await (await getDb()).select().from(s.depositionPackages).where(eq(s.depositionPackages.id, p.id)))[0]!
        .downloadedAt;
    expect((await noted())!.getTime()).toBeGreaterThanOrEqual(before);
    await reading.arrayBuffer();
  });

  it("runs when a new package finishes", async () => {
    const fx = await makeSite();
    const old = [await finished(fx, 1), await finished(fx, 2), await finished(fx, 3)];
    session.userId = fx.people.director.id;
    const started = await call(packagesRoute, "POST", { siteId: fx.site.id }, {});
    expect(started.status, JSON.stringify(started.json)).toBe(201);
    await packagesIdle();
    const db = await getDb();
    const [fresh] = await db.select().from(s.depositionPackages).where(eq(s.depositionPackages.id, started.json.id));
    expect(fresh).toMatchObject({ status: "done", error: null });
    expect(old.map((p) => existsSync(p.file))).toEqual([true, true, false]);
    expect(await filePathOf(old[2]!.id)).toBeNull();
  });

  it("notes a download again while it streams, so one longer than the grace keeps its file", () => {
    vi.useFakeTimers({ toFake: ["setInterval", "clearInterval"] });
    try {
      const stream = new EventEmitter();
      let noted = 0;
      keepNotingDownload(stream, async () => {
        noted++;
      });
      // three hours of streaming: noted at least once within every resume grace
      vi.advanceTimersByTime(3 * RESUME_GRACE_MS);
      expect(noted).toBe(3 * 4);
      // and once more at its end, after which nothing more
      stream.emit("close");
      expect(noted).toBe(3 * 4 + 1);
      vi.advanceTimersByTime(3 * RESUME_GRACE_MS);
      expect(noted).toBe(3 * 4 + 1);
    } finally {
      vi.useRealTimers();
    }
  });
});
