/**
 * `npm run bench -- register`: the finds register and the total-station import at scale, in process, through
 * the real route handlers (guard, zod, use case, database) against an in-memory PGlite.
 *  1. 50,000 finds in the demo site; filtered and sorted register pages, each asked --runs times
 *     (default 25); the median per query is reported. Target: < 200 ms.
 *  2. A 50,000-row total-station CSV: preview (validation only) and import (validate + commit), wall time.
 *     Target: < 10 s for the import.
 * Only the session is stood in for (a module hook answers "who is signed in" with the bench's digger);
 * everything after it is the production code path. Prints a markdown table.
 */
import { register } from "node:module";

const arg = (name: string, fallback: string) =>
  process.argv.find((a) => a.startsWith(`--${name}=`))?.split("=")[1] ?? fallback;
const runs = Number(arg("runs", "25"));
const N = 50_000;
process.env.LOAMWORK_DATA_DIR ??= "memory";

// The session module reads next-auth cookies, which exist only inside a request; this hook swaps it for one
// that names the bench user. Registered before anything imports it.
const stub = `export async function currentUserId() { return globalThis.__benchUserId ?? null; }`;
const hook = `
export async function resolve(specifier, context, next) {
  if (/(^|\\/)(lib\\/server\\/)?session(\\.ts)?$/.test(specifier) && (specifier.startsWith(".") || specifier.startsWith("@/")) && /lib\\/server\\//.test(context.parentURL ?? "")) {
    return { url: "data:text/javascript," + encodeURIComponent(${JSON.stringify(stub)}), shortCircuit: true };
  }
  return next(specifier, context);
}`;
register("data:text/javascript," + encodeURIComponent(hook));

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

async function main() {
  const { getDb, closeDb } = await import("../db/client");
  const s = await import("../db/schema");
  const { seedDemo, DEMO_USERS } = await import("./seed/seed-demo");
  const { and, eq } = await import("drizzle-orm");
  const { checkOutline } = await import("../lib/geometry/outline");
  const { createWindowSampler, createRandom } = await import("../lib/spatial");
  const findsRoute = await import("../app/api/sites/[siteId]/finds/route");
  const importRoute = await import("../app/api/sites/[siteId]/import/route");
  const previewRoute = await import("../app/api/sites/[siteId]/import/preview/route");

  const db = await getDb();
  const { siteId } = await seedDemo(db);
  const [digger] = await db.select().from(s.users).where(eq(s.users.email, DEMO_USERS[0].email));
  (globalThis as Record<string, unknown>).__benchUserId = digger.id;
  const people = await db
    .select({ id: s.memberships.userId })
    .from(s.memberships)
    .where(eq(s.memberships.siteId, siteId));
  const [trench] = await db
    .select()
    .from(s.trenches)
    .where(and(eq(s.trenches.siteId, siteId), eq(s.trenches.code, "A")));
  const ctxs = await db.select().from(s.contexts).where(eq(s.contexts.trenchId, trench.id));
  const classes = await db.select().from(s.artefactClasses).where(eq(s.artefactClasses.siteId, siteId));
  const check = checkOutline(trench.outline);
  if (!check.ok) throw new Error(check.reason);
  const sampler = createWindowSampler(check.window);
  const rnd = createRandom(20261202);
  const pts = (n: number) => {
    const x = new Float64Array(n),
      y = new Float64Array(n);
    sampler.fill(rnd, n, x, y);
    return { x, y };
  };

  // 1. Fill the register to 50,000 finds.
  const [site] = await db.select().from(s.sites).where(eq(s.sites.id, siteId));
  const have = (await db.select({ id: s.finds.id }).from(s.finds).where(eq(s.finds.siteId, siteId))).length;
  const add = N - have;
  const p = pts(add);
  const words = ["flake", "blade", "core", "chip", "sherd", "burnt", "retouched", "cortex"];
  const t0 = Date.parse("2026-06-01T08:00:00Z");
  for (let i = 0; i < add; i += 2000) {
    const values = [];
    for (let k = i; k < Math.min(add, i + 2000); k++) {
      values.push({
        siteId,
        trenchId: trench.id,
        contextId: ctxs[k % ctxs.length].id,
        classId: classes[(k * 7) % classes.length].id,
        number: site.nextFindNumber + k,
        x: p.x[k],
        y: p.y[k],
        z: 10 - (k % 90) / 100,
        method: "imported" as const,
        description: `${words[k % words.length]} ${words[(k * 3) % words.length]}`,
        recordedBy: people[k % people.length].id,
        recordedAt: new Date(t0 + (k % 60) * 86_400_000 + k * 1000),
      });
    }
    await db.insert(s.finds).values(values);
  }
  await db
    .update(s.sites)
    .set({ nextFindNumber: site.nextFindNumber + add })
    .where(eq(s.sites.id, siteId));
  await db.execute("analyze");
  const total = (await db.select({ id: s.finds.id }).from(s.finds).where(eq(s.finds.siteId, siteId))).length;

  const queries: [string, Record<string, string>][] = [
    ["class, sorted by x desc, page 3", { classId: classes[0].id, sort: "x", dir: "desc", page: "3" }],
    [
      "context + date range, sorted by date",
      { contextId: ctxs[1].id, from: "2026-06-10", to: "2026-07-10", sort: "recordedAt", dir: "desc" },
    ],
    ["recorder + class, sorted by context", { recordedBy: people[1].id, classId: classes[1].id, sort: "context" }],
    ["free text 'retouched', sorted by class", { q: "retouched", sort: "class", page: "2" }],
    ["no filter, sorted by number desc, page 400", { sort: "number", dir: "desc", page: "400" }],
  ];
  const rows: string[] = [];
  for (const [label, query] of queries) {
    const url = new URL(`http://bench/api/sites/${siteId}/finds`);
    for (const [k, v] of Object.entries(query)) url.searchParams.set(k, v);
    const times: number[] = [];
    let matched = 0;
    for (let r = 0; r < runs + 2; r++) {
      const start = performance.now();
      const res = await findsRoute.GET(new Request(url), { params: Promise.resolve({ siteId }) });
      const body = await res.json();
      const ms = performance.now() - start;
      if (res.status !== 200) throw new Error(`${label}: ${res.status} ${JSON.stringify(body)}`);
      matched = body.total;
      if (r >= 2) times.push(ms); // the first two warm the query plans
    }
    rows.push(`| register: ${label} | ${matched} of ${total} | ${median(times).toFixed(1)} ms | < 200 ms |`);
  }

  // 2. A 50,000-row total-station file into trench A's open contexts.
  const q = pts(N);
  const openCtx = ctxs.filter((c) => c.state === "open");
  const lines = ["PtID,East,North,Elev,Code,Ctx"];
  const win = check.window;
  for (let i = 0, j = 0; i < N; j++) {
    // Rounded to the millimetre as an instrument writes them; a point rounded across the edge is skipped.
    if (j >= q.x.length) Object.assign(q, pts(N));
    const x = q.x[j % N].toFixed(3),
      y = q.y[j % N].toFixed(3);
    if (!win.contains(Number(x), Number(y))) continue;
    lines.push(
      `,${x},${y},${(9.5 - (i % 50) / 100).toFixed(3)},${classes[i % classes.length].code},${openCtx[i % openCtx.length].number}`,
    );
    i++;
  }
  const csv = lines.join("\n");
  const mapping = { number: "PtID", x: "East", y: "North", z: "Elev", classCode: "Code", contextNumber: "Ctx" };
  const post = (mod: { POST: Function }, body: unknown) =>
    mod.POST(
      new Request("http://bench/x", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(body),
      }),
      { params: Promise.resolve({ siteId }) },
    ) as Promise<Response>;
  let start = performance.now();
  const pr = await post(previewRoute, { csv, fileName: "bench.csv", mapping });
  const prBody = await pr.json();
  const previewMs = performance.now() - start;
  if (pr.status !== 200 || prBody.errors.length)
    throw new Error(`preview: ${pr.status} ${JSON.stringify(prBody).slice(0, 400)}`);
  start = performance.now();
  const im = await post(importRoute, { csv, fileName: "bench.csv", mapping });
  const imBody = await im.json();
  const importMs = performance.now() - start;
  if (im.status !== 201) throw new Error(`import: ${im.status} ${JSON.stringify(imBody).slice(0, 400)}`);
  rows.push(
    `| import preview (parse + validate ${N} rows) | ${prBody.validCount} valid | ${(previewMs / 1000).toFixed(2)} s | — |`,
  );
  rows.push(
    `| import (parse + validate + commit ${N} rows, one transaction) | ${imBody.imported} imported | ${(importMs / 1000).toFixed(2)} s | < 10 s |`,
  );

  const where = process.env.DATABASE_URL ? "PostgreSQL (DATABASE_URL)" : "in-memory PGlite";
  console.log(
    `\nLoamwork register and import benchmark — ${where}, Node ${process.version}, ${runs} runs per query (median)\n`,
  );
  console.log("| case | rows | time | target |\n| --- | --- | --- | --- |");
  for (const r of rows) console.log(r);
  await closeDb();
}

await main();
