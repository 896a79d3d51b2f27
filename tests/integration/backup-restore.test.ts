import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomBytes } from "node:crypto";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { existsSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import pg from "pg";
import * as tar from "tar";
import { embeddedClient, getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { makeBackup } from "@/lib/server/backup/backup";
import type { DatabaseSource, DatabaseTarget } from "@/lib/server/backup/database";
import { listFiles, sha256File } from "@/lib/server/backup/manifest";
import { restoreBackup } from "@/lib/server/backup/restore";
import { createFind, deleteFind } from "@/lib/server/finds";
import { loadSiteActor } from "@/lib/server/membership";
import { createSample } from "@/lib/server/samples";
import { photoFolder, saveFile } from "@/lib/server/uploads/file-store";
import { makeSite } from "../support/fixtures";

/**
 * A backup of the whole database and files store restores into a fresh install with every row of every
 * table (the audit trail included) and every file byte for byte; a damaged archive is refused before anything
 * is written. Runs on whichever database the suite gives this file: the embedded one, or PostgreSQL.
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

const serverUrl = process.env.DATABASE_URL;
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
      fileKey: `key-${Date.now()}`,
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
  if (work) await rm(work, { recursive: true, force: true });
});

describe("backup and restore", () => {
  it("restores every row of every table, the audit trail included, and every file byte for byte", async () => {
    const { target, query } = await freshTarget("restored");
    const filesDir = path.join(work, "files-restored");
    const out = await restoreBackup({ file: archive, filesDir, database: target });
    expect(out.manifest.engine).toBe(source.kind);

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
});
