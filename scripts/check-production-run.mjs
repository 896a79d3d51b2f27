/**
 * One analysis through a running Loamwork's HTTP API, as a script would run it (scripts/check-production.sh):
 * signs in as the demo specialist, starts Besag's L on the flint flakes (FLK) of context 1005 in trench A of
 * the demo site, follows the run to its end and checks the verdict. Plain Node (fetch), no dev tools.
 * Usage: node scripts/check-production-run.mjs http://localhost:PORT
 */
const base = process.argv[2];
if (!base) throw new Error("usage: node scripts/check-production-run.mjs BASE_URL");
const jar = new Map();
const take = (res) => {
  for (const line of res.headers.getSetCookie()) {
    const [pair] = line.split(";");
    const eq = pair.indexOf("=");
    jar.set(pair.slice(0, eq).trim(), pair.slice(eq + 1));
  }
};
const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
async function call(method, path, body) {
  const res = await fetch(base + path, {
    method,
    redirect: "manual",
    headers: { cookie: cookie(), origin: base, ...(body ? { "content-type": "application/json" } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
  take(res);
  const text = await res.text();
  if (res.status >= 400) throw new Error(`${method} ${path} → ${res.status}: ${text.slice(0, 300)}`);
  return text ? JSON.parse(text) : null;
}

const { csrfToken } = await call("GET", "/api/auth/csrf");
const signIn = await fetch(`${base}/api/auth/callback/credentials`, {
  method: "POST",
  redirect: "manual",
  headers: { cookie: cookie(), "content-type": "application/x-www-form-urlencoded" },
  body: new URLSearchParams({
    csrfToken,
    email: "specialist@loamwork.test",
    password: "sieve-specialist-2",
  }).toString(),
});
take(signIn);
if (![...jar.keys()].some((k) => k.includes("session-token"))) throw new Error(`sign-in failed (${signIn.status})`);

const site = (await call("GET", "/api/sites")).find((s) => s.name === "Whinnydale Holm");
if (!site) throw new Error("the demo site is missing: was it seeded?");
const id = site.id;
const trench = (await call("GET", `/api/sites/${id}/trenches`)).find((t) => t.code === "A");
const context = (await call("GET", `/api/sites/${id}/contexts?trenchId=${trench.id}`)).find((c) => c.number === 1005);
const flk = (await call("GET", `/api/sites/${id}/classes`)).find((c) => c.code === "FLK");
const run = await call("POST", `/api/sites/${id}/runs`, {
  scope: { trenchId: trench.id, contextIds: [context.id], classIds: [flk.id] },
  tests: [{ kind: "l-envelope" }],
  params: { nsim: 199, seed: 3 },
});
const started = Date.now();
let view = run;
while (view.status === "queued" || view.status === "running") {
  if (Date.now() - started > 120_000) throw new Error(`the run did not finish in 2 minutes (last: ${view.status})`);
  await new Promise((r) => setTimeout(r, 250));
  view = await call("GET", `/api/sites/${id}/runs/${run.id}`);
}
if (view.status !== "done") throw new Error(`the run ended ${view.status}: ${view.error}`);
const verdict = view.result.results[0]?.verdict;
// FLK in 1005 is laid out clustered by the demo seed (scripts/seed/seed-demo.ts).
if (verdict !== "clustered") throw new Error(`FLK in 1005 should come out clustered; got ${verdict}`);
console.log(`Run ${run.id}: done in ${((Date.now() - started) / 1000).toFixed(1)} s, FLK in 1005 ${verdict}.`);

// The GeoPackage export runs SQLite as WebAssembly from its package, outside the server bundle: one download
// proves the pruned install has it. A GeoPackage is an SQLite file with the application id "GPKG" at byte 68
// (SQLite file format, database header; OGC GeoPackage 1.2 §1.1.1.1.1).
const gpkg = await fetch(`${base}/api/sites/${id}/export/gis`, { headers: { cookie: cookie() } });
const bytes = new Uint8Array(await gpkg.arrayBuffer());
const head = new TextDecoder().decode(bytes.slice(0, 15));
const appId = new TextDecoder().decode(bytes.slice(68, 72));
if (gpkg.status !== 200 || head !== "SQLite format 3" || appId !== "GPKG")
  throw new Error(`the GeoPackage export failed (${gpkg.status}, ${bytes.length} bytes, header "${head}")`);
console.log(`GeoPackage of the demo site: ${bytes.length} bytes.`);
