/**
 * `npm run bench -- package`: the deposition package of a large site, written by the package job exactly as
 * the server writes it (the real route, guard, queue and file store), against an in-memory PGlite. The demo
 * site is filled with invented finds in trench A (default 5,000 and then 50,000, each size in a fresh
 * process) and 200 invented photos (sharp's Gaussian noise as JPEGs of 1200 × 900 pixels, the display copy
 * the package takes). Reported: wall time of the job, the zip's size, and memory — the process's RSS just
 * before the job (the database and the seeded site live in it) and its peak during the job, sampled every
 * 20 ms, with the JavaScript heap's peak. The point: what the job adds must not grow with the site.
 * Options: --sizes=5000,50000 --photos=200.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync } from "node:fs";
import { register } from "node:module";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";

const arg = (name: string, fallback: string) =>
  process.argv.find((a) => a.startsWith(`--${name}=`))?.split("=")[1] ?? fallback;
const MB = 1024 * 1024;

type Result = {
  finds: number;
  photos: number;
  files: number;
  zipBytes: number;
  seconds: number;
  rssBefore: number;
  rssPeak: number;
  heapBefore: number;
  heapPeak: number;
  fingerprint: string;
};

/** One size, in this process (started by the parent below with --finds). */
async function measure(N: number, photoCount: number): Promise<Result> {
  process.env.LOAMWORK_DATA_DIR = "memory";
  process.env.LOAMWORK_FILES_DIR = mkdtempSync(path.join(os.tmpdir(), "loamwork-bench-package-"));
  // The session module reads next-auth cookies, which exist only inside a request; this hook swaps it for one
  // that names the bench user (the director). Registered before anything imports it.
  const stub = `export async function currentUserId() { return globalThis.__benchUserId ?? null; }`;
  const hook = `
export async function resolve(specifier, context, next) {
  if (/(^|\\/)(lib\\/server\\/)?session(\\.ts)?$/.test(specifier) && (specifier.startsWith(".") || specifier.startsWith("@/")) && /lib\\/server\\//.test(context.parentURL ?? "")) {
    return { url: "data:text/javascript," + encodeURIComponent(${JSON.stringify(stub)}), shortCircuit: true };
  }
  return next(specifier, context);
}`;
  register("data:text/javascript," + encodeURIComponent(hook));

  const { getDb, closeDb } = await import("../db/client");
  const s = await import("../db/schema");
  const { seedDemo, DEMO_USERS } = await import("./seed/seed-demo");
  const { and, eq, count } = await import("drizzle-orm");
  const { default: sharp } = await import("sharp");
  const { photoFolder, saveFile } = await import("../lib/server/uploads/file-store");
  const { packagesIdle } = await import("../lib/server/jobs/package-queue");
  const packagesRoute = await import("../app/api/sites/[siteId]/packages/route");

  const db = await getDb();
  const { siteId } = await seedDemo(db);
  const director = DEMO_USERS.find((u) => u.role === "director")!;
  const [me] = await db.select().from(s.users).where(eq(s.users.email, director.email));
  (globalThis as Record<string, unknown>).__benchUserId = me!.id;
  const [trench] = await db
    .select()
    .from(s.trenches)
    .where(and(eq(s.trenches.siteId, siteId), eq(s.trenches.code, "A")));
  const ctxs = await db.select().from(s.contexts).where(eq(s.contexts.trenchId, trench!.id));
  const classes = await db.select().from(s.artefactClasses).where(eq(s.artefactClasses.siteId, siteId));
  const [site] = await db.select().from(s.sites).where(eq(s.sites.id, siteId));

  // Finds up to N, spread over trench A's bounding box (the package does not check where they lie).
  const [have] = await db.select({ n: count() }).from(s.finds).where(eq(s.finds.siteId, siteId));
  const ring = trench!.outline.coordinates[0]!;
  const [x0, x1] = [Math.min(...ring.map((p) => p[0])), Math.max(...ring.map((p) => p[0]))];
  const [y0, y1] = [Math.min(...ring.map((p) => p[1])), Math.max(...ring.map((p) => p[1]))];
  const add = N - have!.n;
  const words = ["flake", "blade", "core", "chip", "sherd", "burnt", "retouched", "cortex"];
  for (let i = 0; i < add; i += 2000) {
    const values = [];
    for (let k = i; k < Math.min(add, i + 2000); k++)
      values.push({
        siteId,
        trenchId: trench!.id,
        contextId: ctxs[k % ctxs.length]!.id,
        classId: classes[(k * 7) % classes.length]!.id,
        number: site!.nextFindNumber + k,
        x: x0 + ((k * 0.6180339887) % 1) * (x1 - x0),
        y: y0 + ((k * 0.7548776662) % 1) * (y1 - y0),
        z: 49 - (k % 90) / 100,
        method: "imported" as const,
        description: `${words[k % words.length]} ${words[(k * 3) % words.length]}`,
        recordedBy: me!.id,
        recordedAt: new Date(Date.parse("2026-06-01T08:00:00Z") + k * 1000),
      });
    await db.insert(s.finds).values(values);
  }
  await db
    .update(s.sites)
    .set({ nextFindNumber: site!.nextFindNumber + add })
    .where(eq(s.sites.id, siteId));

  for (let i = 0; i < photoCount; i++) {
    const id = crypto.randomUUID();
    const folder = photoFolder(siteId, id);
    const jpeg = await sharp({
      create: {
        width: 1200,
        height: 900,
        channels: 3,
        background: "#808080",
        noise: { type: "gaussian", mean: 128, sigma: 24 },
      },
    })
      .jpeg({ quality: 80 })
      .toBuffer();
    await saveFile(`${folder}/display.jpg`, jpeg);
    await db.insert(s.photos).values({
      id,
      siteId,
      trenchId: trench!.id,
      fileKey: `bench-${id}`,
      fileName: `bench-${String(i + 1).padStart(3, "0")}.jpg`,
      mimeType: "image/jpeg",
      width: 1200,
      height: 900,
      displayPath: `${folder}/display.jpg`,
      uploadedBy: me!.id,
    });
  }
  await db.execute("analyze");

  const gc = (globalThis as { gc?: () => void }).gc;
  gc?.();
  const before = process.memoryUsage();
  let rssPeak = before.rss;
  let heapPeak = before.heapUsed;
  const sampler = setInterval(() => {
    const m = process.memoryUsage();
    rssPeak = Math.max(rssPeak, m.rss);
    heapPeak = Math.max(heapPeak, m.heapUsed);
  }, 20);
  const start = performance.now();
  const res = await packagesRoute.POST(
    new Request("http://bench/x", { method: "POST", headers: { "content-type": "application/json" }, body: "{}" }),
    { params: Promise.resolve({ siteId }) },
  );
  const job = (await res.json()) as { id: string };
  if (res.status !== 201) throw new Error(`start: ${res.status} ${JSON.stringify(job)}`);
  await packagesIdle();
  const seconds = (performance.now() - start) / 1000;
  clearInterval(sampler);
  const [row] = await db.select().from(s.depositionPackages).where(eq(s.depositionPackages.id, job.id));
  if (row?.status !== "done") throw new Error(`the package did not finish: ${row?.status} ${row?.error}`);
  await closeDb();
  return {
    finds: N,
    photos: photoCount,
    files: row.filesTotal,
    zipBytes: row.bytes ?? 0,
    seconds,
    rssBefore: before.rss,
    rssPeak,
    heapBefore: before.heapUsed,
    heapPeak,
    fingerprint: row.fingerprint ?? "",
  };
}

const finds = Number(arg("finds", "0"));
const photos = Number(arg("photos", "200"));
if (finds > 0) {
  const result = await measure(finds, photos);
  console.log(`RESULT ${JSON.stringify(result)}`);
} else {
  // Each size in a fresh process, so one size's heap and database do not colour the other's.
  const sizes = arg("sizes", "5000,50000").split(",").map(Number);
  const results: Result[] = [];
  const load = [];
  for (const n of sizes) {
    load.push(os.loadavg()[0]!);
    const run = spawnSync(
      process.execPath,
      ["--expose-gc", ...process.execArgv, fileURLToPath(import.meta.url), `--finds=${n}`, `--photos=${photos}`],
      { encoding: "utf8", stdio: ["ignore", "pipe", "inherit"], maxBuffer: 16 * MB },
    );
    const line = run.stdout.split("\n").find((l) => l.startsWith("RESULT "));
    if (run.status !== 0 || !line) {
      process.stdout.write(run.stdout);
      process.exit(run.status ?? 1);
    }
    results.push(JSON.parse(line.slice(7)) as Result);
  }
  load.push(os.loadavg()[0]!);
  const mb = (b: number) => `${(b / MB).toFixed(0)} MB`;
  const cpu = os.cpus();
  console.log(
    `\nLoamwork deposition package benchmark — in-memory PGlite, ${new Date().toISOString().slice(0, 16).replace("T", " ")} UTC, ` +
      `${cpu.length} cores (${cpu[0]?.model.trim()}), ${mb(os.totalmem())} RAM, Node ${process.version}; ` +
      `load average (1 min) ${load.map((l) => l.toFixed(1)).join(" → ")}\n`,
  );
  console.log(
    "| finds | photos | files | zip | job wall time | RSS before | RSS peak | RSS added | heap before | heap peak |",
  );
  console.log("| ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |");
  for (const r of results)
    console.log(
      `| ${r.finds.toLocaleString("en")} | ${r.photos} | ${r.files} | ${mb(r.zipBytes)} | ${r.seconds.toFixed(1)} s | ` +
        `${mb(r.rssBefore)} | ${mb(r.rssPeak)} | ${mb(r.rssPeak - r.rssBefore)} | ${mb(r.heapBefore)} | ${mb(r.heapPeak)} |`,
    );
}
