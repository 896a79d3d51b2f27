import "server-only";
import type { z } from "zod";
import type { Db } from "@/db/client";
import type { Site } from "@/db/schema";
import { allFinds } from "@/lib/server/finds";
import { listTrenches } from "@/lib/server/trenches";
import { contextsForExport } from "./contexts-export";
import { contextsCsv, drawingsCsv, findsCsv, samplesCsv } from "./csv";
import { allDrawings } from "@/lib/server/drawings";
import type { exportDrawingsQuery } from "@/lib/schemas/drawing";
import { allSamples } from "@/lib/server/samples";
import type { exportSamplesQuery } from "@/lib/schemas/sample";
import { findsGeoJson, outlinesGeoJson } from "./geojson";
import type { exportContextsQuery, exportFindsQuery, exportTrenchesQuery } from "@/lib/schemas/export";

const stamp = () => new Date().toISOString().slice(0, 10);

/** A download: the browser saves it under `name` instead of showing it. */
export function download(body: string | Uint8Array, name: string, type: string): Response {
  return new Response(body as BodyInit, {
    headers: {
      "content-type": type,
      "content-disposition": `attachment; filename="${name.replace(/[^\w.-]+/g, "_")}"`,
      "cache-control": "no-store",
    },
  });
}

const geo = (obj: unknown, name: string) => download(JSON.stringify(obj), name, "application/geo+json");

export async function exportFinds(db: Db, site: Site, q: z.infer<typeof exportFindsQuery>): Promise<Response> {
  const { format, coords: _wgs84, ...filters } = q;
  const rows = await allFinds(db, site.id, filters);
  if (format === "csv") return download(findsCsv(rows), `${site.code}-finds-${stamp()}.csv`, "text/csv; charset=utf-8");
  return geo(findsGeoJson(site, "lonlat", rows), `${site.code}-finds-wgs84-${stamp()}.geojson`);
}

export async function exportContexts(db: Db, site: Site, q: z.infer<typeof exportContextsQuery>): Promise<Response> {
  const rows = await contextsForExport(db, site.id);
  if (q.format === "csv")
    return download(contextsCsv(rows), `${site.code}-contexts-${stamp()}.csv`, "text/csv; charset=utf-8");
  const items = rows.map((c) => ({
    id: c.id,
    polygon: c.extent,
    properties: { number: c.number, trench: c.trenchCode, type: c.type, state: c.state, relations: c.relations },
  }));
  return geo(
    outlinesGeoJson(site, "lonlat", `${site.code} context extents`, items),
    `${site.code}-context-extents-wgs84-${stamp()}.geojson`,
  );
}

export async function exportTrenches(db: Db, site: Site, _q: z.infer<typeof exportTrenchesQuery>): Promise<Response> {
  const rows = await listTrenches(db, site.id);
  const items = rows.map((t) => ({
    id: t.id,
    polygon: t.outline,
    properties: { code: t.code, name: t.name, signedOff: t.signedOffAt !== null },
  }));
  return geo(
    outlinesGeoJson(site, "lonlat", `${site.code} trench outlines`, items),
    `${site.code}-trenches-wgs84-${stamp()}.geojson`,
  );
}

export async function exportSamples(db: Db, site: Site, q: z.infer<typeof exportSamplesQuery>): Promise<Response> {
  const rows = await allSamples(db, site.id, q);
  return download(samplesCsv(rows), `${site.code}-samples-${stamp()}.csv`, "text/csv; charset=utf-8");
}

export async function exportDrawings(db: Db, site: Site, q: z.infer<typeof exportDrawingsQuery>): Promise<Response> {
  const rows = await allDrawings(db, site.id, q);
  return download(drawingsCsv(rows), `${site.code}-drawings-${stamp()}.csv`, "text/csv; charset=utf-8");
}
