import { createHash } from "node:crypto";
import { existsSync } from "node:fs";
import { beforeAll, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { unzipSync } from "fflate";
import { call, session } from "../support/harness";
import { checkBag } from "../support/bagit-check";
import { seedDemoSite, type DemoSite } from "../support/demo-site";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { seedDemoPhoto } from "@/scripts/seed/seed-demo-photo";
import { packageFiles, planPackage } from "@/lib/server/export/deposition";
import { packageFilePath, requeuePackages } from "@/lib/server/export/package-writer";
import { packagesIdle } from "@/lib/server/jobs/package-queue";
import { storePath } from "@/lib/server/uploads/file-store";
import * as packagesRoute from "@/app/api/sites/[siteId]/packages/route";
import * as packageRoute from "@/app/api/sites/[siteId]/packages/[packageId]/route";
import * as fileRoute from "@/app/api/sites/[siteId]/packages/[packageId]/file/route";

let demo: DemoSite;
const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

async function download(packageId: string, range?: string) {
  const headers: Record<string, string> = range ? { range } : {};
  const res = await fileRoute.GET(new Request("http://localhost/x", { headers }), {
    params: Promise.resolve({ siteId: demo.siteId, packageId }),
  });
  return { res, bytes: new Uint8Array(await res.arrayBuffer()) };
}

beforeAll(async () => {
  demo = await seedDemoSite();
  await seedDemoPhoto(await getDb());
}, 240_000);

describe("deposition package as a job", () => {
  it("reports each entry done out of the known total, in order", async () => {
    const db = await getDb();
    const [site] = await db.select().from(s.sites).where(eq(s.sites.id, demo.siteId));
    const plan = await planPackage(db, site!, demo.people.director!);
    const heard: [number, number][] = [];
    let files = 0;
    for await (const file of packageFiles(plan, (done, total) => heard.push([done, total]))) {
      // The file just made is not yet counted: it counts once the zip has taken it and asks for the next.
      expect(heard.length).toBe(files);
      files++;
      if (!(file.bytes instanceof Uint8Array)) for await (const chunk of file.bytes) void chunk;
    }
    expect(plan.entries.length).toBeGreaterThan(12);
    expect(heard).toEqual(plan.entries.map((_, i) => [i + 1, plan.entries.length]));
  });

  it("writes the package to the file store in the background; the download streams it, with ranges", async () => {
    session.userId = demo.people.director!;
    const started = await call(packagesRoute, "POST", { siteId: demo.siteId }, {});
    expect(started.status).toBe(201);
    expect(started.json).toMatchObject({ trench: null, createdBy: expect.any(String), fingerprint: null });
    expect(["queued", "running"]).toContain(started.json.status);
    const id = started.json.id as string;

    await packagesIdle();
    const done = await call(packageRoute, "GET", { siteId: demo.siteId, packageId: id });
    expect(done.status).toBe(200);
    expect(done.json.status).toBe("done");
    expect(done.json.filesTotal).toBeGreaterThan(12);
    expect(done.json.filesDone).toBe(done.json.filesTotal);
    expect(done.json.fingerprint).toMatch(/^[0-9a-f]{64}$/);
    expect(existsSync(storePath(packageFilePath(demo.siteId, id)))).toBe(true);
    expect(existsSync(storePath(`${packageFilePath(demo.siteId, id)}.part`))).toBe(false);

    const { res, bytes } = await download(id);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/zip");
    expect(res.headers.get("accept-ranges")).toBe("bytes");
    expect(res.headers.get("content-disposition")).toBe(`attachment; filename="${done.json.fileName}"`);
    expect(bytes.byteLength).toBe(done.json.bytes);
    const bag = checkBag(unzipSync(bytes));
    expect(bag.problems).toEqual([]);
    // The fingerprint on the job is the SHA-256 of the manifest in the file, and what bag-info.txt states.
    expect(sha256(bag.files.get("manifest-sha256.txt")!)).toBe(done.json.fingerprint);
    expect(bag.info.get("Package-Fingerprint")).toBe(`sha256:${done.json.fingerprint}`);
    const payload = [...bag.files.keys()].filter((p) => p.startsWith("data/"));
    expect(payload.length).toBe(done.json.filesTotal);

    const head = await download(id, "bytes=0-3");
    expect(head.res.status).toBe(206);
    expect(head.res.headers.get("content-range")).toBe(`bytes 0-3/${bytes.byteLength}`);
    expect([...head.bytes]).toEqual([0x50, 0x4b, 0x03, 0x04]); // a zip's local file header signature
    const tail = await download(id, "bytes=-22");
    expect(tail.res.status).toBe(206);
    expect(tail.bytes).toEqual(bytes.slice(-22));
    const middle = await download(id, `bytes=100-`);
    expect(middle.bytes).toEqual(bytes.slice(100));
    expect((await download(id, `bytes=${bytes.byteLength}-`)).res.status).toBe(416);

    const list = await call(packagesRoute, "GET", { siteId: demo.siteId });
    expect(list.json.map((p: { id: string }) => p.id)).toContain(id);
    const [entry] = await (await getDb()).select().from(s.auditEntries).where(eq(s.auditEntries.recordId, id));
    expect(entry).toMatchObject({ action: "create", recordType: "package", actorId: demo.people.director });
  });

  it("refuses a trench not signed off, naming the field, and writes nothing", async () => {
    const db = await getDb();
    session.userId = demo.people.director!;
    const [before] = await db.select({ n: count() }).from(s.depositionPackages);
    const res = await call(packagesRoute, "POST", { siteId: demo.siteId }, { trenchId: demo.trenchId });
    expect(res.status).toBe(400);
    expect(res.json.fieldErrors.trenchId[0]).toMatch(/not signed off/);
    const [after] = await db.select({ n: count() }).from(s.depositionPackages);
    expect(after!.n).toBe(before!.n);
  });

  it("keeps the package from everyone but the site's directors; no file until it is written", async () => {
    const db = await getDb();
    const [row] = await db
      .insert(s.depositionPackages)
      .values({ siteId: demo.siteId, createdBy: demo.people.director! })
      .returning();
    for (const role of ["digger", "specialist"]) {
      session.userId = demo.people[role]!;
      expect((await call(packageRoute, "GET", { siteId: demo.siteId, packageId: row!.id })).status).toBe(403);
      expect((await download(row!.id)).res.status).toBe(403);
    }
    session.userId = demo.people.director!;
    const early = await download(row!.id);
    expect(early.res.status).toBe(409);
    expect(JSON.parse(new TextDecoder().decode(early.bytes)).error).toMatch(/not written yet/);
    // A package a stopped server left queued or half-written is queued again when the queue starts.
    await db
      .update(s.depositionPackages)
      .set({ status: "running", filesDone: 3 })
      .where(eq(s.depositionPackages.id, row!.id));
    expect(await requeuePackages(db)).toContain(row!.id);
    const [again] = await db.select().from(s.depositionPackages).where(eq(s.depositionPackages.id, row!.id));
    expect(again).toMatchObject({ status: "queued", filesDone: 0 });
  });
});
