import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash, randomBytes } from "node:crypto";
import { mkdtemp, readFile, readdir, rm, writeFile } from "node:fs/promises";
import { existsSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import pg from "pg";
import * as tar from "tar";
import { embeddedClient, getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { UTApi, UTFile } from "uploadthing/server";
import { FAKE_UPLOADTHING_TOKEN, startUploadFake, type UploadFake } from "@/lib/dev-services/upload-fake";
import { makeBackup } from "@/lib/server/backup/backup";
import type { DatabaseSource, DatabaseTarget } from "@/lib/server/backup/database";
import { listFiles, sha256File } from "@/lib/server/backup/manifest";
import { restoreBackup } from "@/lib/server/backup/restore";
import { createFind, deleteFind } from "@/lib/server/finds";
import { loadSiteActor } from "@/lib/server/membership";
import { createSample } from "@/lib/server/samples";
import { photoFolder, saveFile } from "@/lib/server/uploads/file-store";
import { fetchUpload, seededPhotoKey } from "@/lib/server/uploads/remote";
import { makeSite } from "../support/fixtures";

/**
 * A backup of the whole database, files store and photo originals (fetched from the upload service, here the
 * local stand-in) restores into a fresh install with every row of every table (the audit trail included),
 * every file byte for byte, and every original back at the upload service — the same one, or a new one after
 * the old was lost; a damaged archive is refused before anything is written. Runs on whichever database the
 * suite gives this file: the embedded one, or PostgreSQL.
 */

type Query = (text: string) => Promise<{ rows: unknown[] }>;

/** Every row of every table, as JSON text, in a stable order: "schema.table" → rows. */
async function everyRow(query: Query): Promise<Record<string, string[]>> {
  const { rows } = await query(
    `select table_schema as s, table_name as t from information_schema.tables
     where table_type = 'BASE TABLE' and table_schema not in ('pg_catalog', 'information_schema') order by 1, 2`,
  );
  const out: Record<string, string[]> = {};
  for (const { s, t } of rows as { s: string; t: string }[]) {
    const r = await query(`select row_to_json(backed_up_row)::text as r from "${s}"."${t}" backed_up_row order by 1`);
    out[`${s}.${t}`] = (r.rows as { r: string }[]).map((row) => row.r);
  }
  return out;
}

async function digests(dir: string): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const p of await listFiles(dir)) out[p] = (await sha256File(path.join(dir, p))).sha256;
  return out;
}

/** Points the app's upload service settings (UTApi) at one running stand-in, as the stack does. */
function useService(fake: UploadFake) {
  Object.assign(process.env, {
    UPLOADTHING_TOKEN: FAKE_UPLOADTHING_TOKEN,
    UPLOADTHING_API_URL: fake.url,
    UPLOADTHING_INGEST_URL: fake.url,
    UPLOADTHING_UFS_HOST: fake.ufs.ufsHost,
    UPLOADTHING_UFS_APP_ID_LOCATION: fake.ufs.ufsAppIdLocation,
  });
}

async function serviceKeys(): Promise<string[]> {
  const { files } = await new UTApi({ logLevel: "Error" }).listFiles({ limit: 500 });
  return files.map((f) => f.key).sort();
}

const serverUrl = process.env.DATABASE_URL;
/** The upload service the site used, and one started fresh after that one was lost. */
let service: UploadFake;
let newService: UploadFake;
/** The photos' originals as uploaded: photo id → bytes. */
const originals = new Map<string, Buffer>();
let work: string;
let archive: string;
let source: DatabaseSource;
let sourceQuery: Query;
const extraDatabases: string[] = [];

/** A fresh, empty target of the same engine as the source. */
async function freshTarget(
  name: string,
): Promise<{ target: DatabaseTarget; query: () => Promise<Query & { close: () => Promise<void> }> }> {
  if (!serverUrl) {
    const dataDir = path.join(work, `db-${name}`);
    return {
      target: { kind: "pglite", dataDir },
      query: async () => {
        const client = new PGlite(dataDir);
        const q = ((text: string) => client.query(text)) as unknown as Query & { close: () => Promise<void> };
        q.close = () => client.close();
        return q;
      },
    };
  }
  const dbName = `${new URL(serverUrl).pathname.slice(1)}_${name}`;
  const admin = new pg.Client({ connectionString: serverUrl });
  await admin.connect();
  await admin.query(`create database "${dbName}"`);
  await admin.end();
  extraDatabases.push(dbName);
  const url = new URL(serverUrl);
  url.pathname = `/${dbName}`;
  return {
    target: { kind: "postgresql", url: url.toString() },
    query: async () => {
      const client = new pg.Client({ connectionString: url.toString() });
      await client.connect();
      const q = ((text: string) => client.query(text)) as unknown as Query & { close: () => Promise<void> };
      q.close = () => client.end();
      return q;
    },
  };
}

beforeAll(async () => {
  work = await mkdtemp(path.join(os.tmpdir(), "loamwork-backup-test-"));
  archive = path.join(work, "site.tar.gz");
  service = await startUploadFake({ port: 0, dir: path.join(work, "service") });
  newService = await startUploadFake({ port: 0, dir: path.join(work, "new-service") });
  useService(service);
  const upload = async (bytes: Buffer, name: string) => {
    const res = await new UTApi({ logLevel: "Error" }).uploadFiles(
      new UTFile([new Uint8Array(bytes)], name, { type: "image/jpeg" }),
    );
    if (!res.data) throw new Error(`upload failed: ${res.error?.message}`);
    return res.data.key;
  };
  const planOriginal = randomBytes(70_000);
  const db = await getDb();
  const fx = await makeSite();
  const digger = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
  for (let i = 0; i < 5; i++)
    await createFind(db, digger, {
      contextId: fx.context.id,
      classId: fx.cls.id,
      x: 1 + i / 10,
      y: 2,
      description: `flake ${i} — “quoted”, with a comma`,
      method: "typed",
    });
  const gone = await createFind(db, digger, {
    contextId: fx.context.id,
    classId: fx.cls.id,
    x: 1,
    y: 1,
    description: "",
    method: "typed",
  });
  await deleteFind(db, digger, gone.id);
  await createSample(db, digger, { contextId: fx.context.id, type: "bulk", purpose: "flotation", volumeL: 40 });
  const [photo] = await db
    .insert(schema.photos)
    .values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      fileKey: await upload(planOriginal, "plan.jpg"),
      fileName: "plan.jpg",
      mimeType: "image/jpeg",
    })
    .returning();
  const folder = photoFolder(fx.site.id, photo!.id);
  await saveFile(`${folder}/display.jpg`, randomBytes(40_000));
  await saveFile(`${folder}/thumb.jpg`, randomBytes(3_000));
  await db
    .update(schema.photos)
    .set({ displayPath: `${folder}/display.jpg`, thumbPath: `${folder}/thumb.jpg` })
    .where((await import("drizzle-orm")).eq(schema.photos.id, photo!.id));
  originals.set(photo!.id, planOriginal);
  // A record photo of the context, its original at the service too; and a photo the demo seed made, with none.
  const recordOriginal = randomBytes(12_345);
  const [record] = await db
    .insert(schema.photos)
    .values({
      siteId: fx.site.id,
      kind: "record",
      number: 1,
      contextId: fx.context.id,
      fileKey: await upload(recordOriginal, "north face.jpg"),
      fileName: "north face.jpg",
      mimeType: "image/jpeg",
    })
    .returning();
  originals.set(record!.id, recordOriginal);
  const seededId = crypto.randomUUID();
  await db.insert(schema.photos).values({
    id: seededId,
    siteId: fx.site.id,
    trenchId: fx.trench.id,
    fileKey: seededPhotoKey(seededId),
    fileName: "invented.jpg",
    mimeType: "image/jpeg",
  });

  if (serverUrl) {
    const client = new pg.Client({ connectionString: serverUrl });
    await client.connect();
    source = { kind: "postgresql", url: serverUrl };
    sourceQuery = (text) => client.query(text);
    afterAll(() => client.end());
  } else {
    const client = (await embeddedClient())!;
    source = { kind: "pglite", client };
    sourceQuery = (text) => client.query(text);
  }
  await makeBackup({ file: archive, filesDir: process.env.LOAMWORK_FILES_DIR!, database: source });
});

afterAll(async () => {
  if (serverUrl && extraDatabases.length) {
    const admin = new pg.Client({ connectionString: serverUrl });
    await admin.connect();
    for (const name of extraDatabases) await admin.query(`drop database if exists "${name}" with (force)`);
    await admin.end();
  }
  await service?.stop();
  await newService?.stop();
  if (work) await rm(work, { recursive: true, force: true });
});

describe("backup and restore", () => {
  it("restores every row of every table, the audit trail included, and every file byte for byte", async () => {
    const { target, query } = await freshTarget("restored");
    const filesDir = path.join(work, "files-restored");
    const out = await restoreBackup({ file: archive, filesDir, database: target });
    expect(out.manifest.engine).toBe(source.kind);
    // The service that holds the originals was not lost: each is still there byte for byte, and kept.
    expect(out.originals).toEqual({ uploaded: 0, kept: 2 });

    const before = await everyRow(sourceQuery);
    const q = await query();
    const after = await everyRow(q);
    await q.close();
    expect(Object.keys(after)).toEqual(Object.keys(before));
    for (const table of Object.keys(before)) expect(after[table], table).toEqual(before[table]);
    // The round trip is not empty: the records, their audit entries and the photo's files are there.
    expect(before["public.finds"]).toHaveLength(5);
    expect(before["public.samples"]).toHaveLength(1);
    expect(before["public.audit_entries"]!.length).toBeGreaterThanOrEqual(8);
    expect(before["public.audit_entries"]!.some((r) => r.includes('"action":"delete"'))).toBe(true);

    const sourceFiles = await digests(process.env.LOAMWORK_FILES_DIR!);
    expect(Object.keys(sourceFiles)).toHaveLength(2);
    expect(await digests(filesDir)).toEqual(sourceFiles);
  });

  it("holds every photo's original, listed in the manifest with its digest, and none for a seeded photo", async () => {
    const unpacked = path.join(work, "look");
    await (await import("node:fs/promises")).mkdir(unpacked);
    await tar.x({ file: archive, cwd: unpacked });
    const manifest = JSON.parse(await readFile(path.join(unpacked, "manifest.json"), "utf8"));
    expect(manifest.seededPhotos).toBe(1);
    expect(manifest.originals.map((o: { photoId: string }) => o.photoId).sort()).toEqual([...originals.keys()].sort());
    for (const o of manifest.originals) {
      const bytes = originals.get(o.photoId)!;
      expect(o.sha256).toBe(createHash("sha256").update(bytes).digest("hex"));
      expect(await readFile(path.join(unpacked, o.path))).toEqual(bytes);
      expect(manifest.files).toContainEqual({ path: o.path, sha256: o.sha256, bytes: bytes.length });
    }
    expect(manifest.originals.map((o: { photo: string }) => o.photo)).toContainEqual(
      expect.stringMatching(/ photo 1 “north face\.jpg” \(id /),
    );
  });

  it("puts the originals back at a new upload service after the old one is lost, rewriting the photos' keys", async () => {
    const { target, query } = await freshTarget("new_service");
    useService(newService);
    try {
      expect(await serviceKeys()).toEqual([]);
      const out = await restoreBackup({
        file: archive,
        filesDir: path.join(work, "files-new-service"),
        database: target,
      });
      expect(out.originals).toEqual({ uploaded: 2, kept: 0 });

      const q = await query();
      const restored = (await q(`select id::text as id, file_key from photos order by id`)).rows as {
        id: string;
        file_key: string;
      }[];
      const after = await everyRow(q);
      await q.close();
      const before = await everyRow(sourceQuery);
      // Every other row of every table as it was; the photos differ only in their keys at the service.
      const keyless = (rows: string[]) =>
        rows.map((r) => JSON.stringify({ ...JSON.parse(r), file_key: undefined })).sort();
      for (const table of Object.keys(before))
        if (table === "public.photos") expect(keyless(after[table]!), table).toEqual(keyless(before[table]!));
        else expect(after[table], table).toEqual(before[table]);

      const newKeys = restored.filter((p) => originals.has(p.id)).map((p) => p.file_key);
      expect(newKeys.sort()).toEqual(await serviceKeys());
      for (const p of restored.filter((r) => originals.has(r.id)))
        expect(await fetchUpload(p.file_key, 1 << 24)).toEqual(originals.get(p.id));
    } finally {
      useService(service);
    }
  });

  it("refuses an archive whose photo original was changed, naming it, and sends nothing to the service", async () => {
    const unpacked = path.join(work, "unpacked-original");
    await (await import("node:fs/promises")).mkdir(unpacked);
    await tar.x({ file: archive, cwd: unpacked });
    const victim = (await listFiles(unpacked)).find((p) => p.startsWith("originals/"))!;
    const bytes = await readFile(path.join(unpacked, victim));
    bytes[5] = bytes[5]! ^ 0x10;
    await writeFile(path.join(unpacked, victim), bytes);
    const tampered = path.join(work, "tampered-original.tar.gz");
    await tar.c({ file: tampered, gzip: true, cwd: unpacked, portable: true }, await listFiles(unpacked));

    const { target } = await freshTarget("tampered_original");
    const filesDir = path.join(work, "files-tampered-original");
    const fresh = await startUploadFake({ port: 0, dir: path.join(work, "fresh-service") });
    useService(fresh);
    try {
      await expect(restoreBackup({ file: tampered, filesDir, database: target })).rejects.toThrow(
        `The backup is damaged and was not restored (nothing was written): ${victim} does not match its SHA-256 digest in the manifest.`,
      );
      expect(await serviceKeys()).toEqual([]);
    } finally {
      useService(service);
      await fresh.stop();
    }
    expect(existsSync(filesDir)).toBe(false);
    if (target.kind === "pglite") expect(existsSync(target.dataDir)).toBe(false);
  });

  it("loads nothing and takes the sent originals back when a photo's key cannot be rewritten", async () => {
    const unpacked = path.join(work, "unpacked-key");
    await (await import("node:fs/promises")).mkdir(unpacked);
    await tar.x({ file: archive, cwd: unpacked });
    const manifest = JSON.parse(await readFile(path.join(unpacked, "manifest.json"), "utf8"));
    // The manifest names a key the dumped photo does not have: the rewrite finds one photo fewer than it sent.
    manifest.originals[1].fileKey = "not-the-photos-key";
    await writeFile(path.join(unpacked, "manifest.json"), JSON.stringify(manifest));
    const odd = path.join(work, "odd-key.tar.gz");
    await tar.c({ file: odd, gzip: true, cwd: unpacked, portable: true }, await listFiles(unpacked));

    const { target, query } = await freshTarget("odd_key");
    const fresh = await startUploadFake({ port: 0, dir: path.join(work, "odd-service") });
    useService(fresh);
    try {
      await expect(
        restoreBackup({ file: odd, filesDir: path.join(work, "files-odd"), database: target }),
      ).rejects.toThrow(/only 1 of 2 photos took the new keys of their originals/);
      // Both originals were sent, then taken back when the database load rolled back.
      expect(await serviceKeys()).toEqual([]);
    } finally {
      useService(service);
      await fresh.stop();
    }
    if (target.kind === "pglite") expect((await readdir(target.dataDir)).length).toBe(0);
    else {
      const q = await query();
      const { rows } = await q(
        `select count(*)::int as n from information_schema.tables where table_schema = 'public'`,
      );
      await q.close();
      expect((rows[0] as { n: number }).n).toBe(0);
    }
  });

  it("refuses an archive whose file no longer matches its digest, naming it, and writes nothing", async () => {
    const unpacked = path.join(work, "unpacked");
    await (await import("node:fs/promises")).mkdir(unpacked);
    await tar.x({ file: archive, cwd: unpacked });
    const victim = (await listFiles(unpacked)).find((p) => p.endsWith("thumb.jpg"))!;
    const bytes = await readFile(path.join(unpacked, victim));
    bytes[100] = bytes[100]! ^ 0xff;
    await writeFile(path.join(unpacked, victim), bytes);
    const tampered = path.join(work, "tampered.tar.gz");
    await tar.c({ file: tampered, gzip: true, cwd: unpacked, portable: true }, await listFiles(unpacked));

    const { target } = await freshTarget("tampered");
    const filesDir = path.join(work, "files-tampered");
    await expect(restoreBackup({ file: tampered, filesDir, database: target })).rejects.toThrow(
      `The backup is damaged and was not restored (nothing was written): ${victim} does not match its SHA-256 digest in the manifest.`,
    );
    expect(existsSync(filesDir)).toBe(false);
    if (target.kind === "pglite") expect(existsSync(target.dataDir)).toBe(false);
    else {
      const client = new pg.Client({ connectionString: target.url });
      await client.connect();
      const { rows } = await client.query(
        `select count(*)::int as n from information_schema.tables where table_schema = 'public'`,
      );
      await client.end();
      expect(rows[0].n).toBe(0);
    }
  });

  it("refuses an archive with a changed byte, and a target that is not a fresh install", async () => {
    const bytes = await readFile(archive);
    bytes[Math.floor(bytes.length / 2)] = bytes[Math.floor(bytes.length / 2)]! ^ 0x01;
    const broken = path.join(work, "broken.tar.gz");
    await writeFile(broken, bytes);
    const { target } = await freshTarget("broken");
    await expect(
      restoreBackup({ file: broken, filesDir: path.join(work, "files-broken"), database: target }),
    ).rejects.toThrow(/damaged/);

    // The first restore's target already holds the site: a second restore into it is refused.
    const used = await freshTarget("twice");
    await restoreBackup({ file: archive, filesDir: path.join(work, "files-twice"), database: used.target });
    await expect(
      restoreBackup({ file: archive, filesDir: path.join(work, "files-twice-2"), database: used.target }),
    ).rejects.toThrow(/fresh install/);
  });

  it("fails a backup whose original the service no longer has, naming the photo, and writes no archive", async () => {
    const [gone] = [...originals.keys()];
    const q = await sourceQuery(`select file_key from photos where id = '${gone}'`);
    const key = (q.rows[0] as { file_key: string }).file_key;
    const out = await new UTApi({ logLevel: "Error" }).deleteFiles(key);
    expect(out.deletedCount).toBe(1);
    const file = path.join(work, "without-original.tar.gz");
    await expect(makeBackup({ file, filesDir: process.env.LOAMWORK_FILES_DIR!, database: source })).rejects.toThrow(
      new RegExp(
        `^The original of 1 of 2 photo\\(s\\) could not be fetched from the upload service, so no backup was written: .*\\(id ${gone}\\): the upload service answered 404`,
      ),
    );
    expect(existsSync(file)).toBe(false);
    expect(existsSync(`${file}.partial`)).toBe(false);
  });
});
