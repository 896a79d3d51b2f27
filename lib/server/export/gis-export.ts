import "server-only";
import type { z } from "zod";
import type { Db } from "@/db/client";
import type { PolygonJson, Site } from "@/db/schema";
import { findsByNumber, type RegisterRow } from "@/lib/server/finds";
import { allSamples } from "@/lib/server/samples";
import { getTrench, listTrenches } from "@/lib/server/trenches";
import type { CoordSpace, exportGisQuery } from "@/lib/schemas/export";
import { contextsForExport } from "./contexts-export";
import { makeTransform, type Transform } from "./coords";
import { download } from "./files";
import { exportPolygon } from "./geojson";
import { WGS84_SRS, writeGeoPackage, type GpkgFeature, type GpkgLayer, type GpkgSrs } from "./geopackage";
import { projectedSrs, siteGridSrs } from "./gis-srs";

type GisData = {
  trenches: Awaited<ReturnType<typeof listTrenches>>;
  contexts: Awaited<ReturnType<typeof contextsForExport>>;
  /** The finds, read again for each layer a page at a time: a site can hold tens of thousands. */
  finds: () => AsyncIterable<RegisterRow[]>;
  samples: Awaited<ReturnType<typeof allSamples>>;
};

async function* each<T, U>(pages: AsyncIterable<T[]>, f: (row: T) => U) {
  for await (const page of pages) for (const row of page) yield f(row);
}

async function readGisData(db: Db, site: Site, trenchId: string | undefined): Promise<GisData> {
  const inScope = (t: { trenchId: string }) => !trenchId || t.trenchId === trenchId;
  const [trenches, contexts, samples] = await Promise.all([
    listTrenches(db, site.id),
    contextsForExport(db, site.id),
    allSamples(db, site.id, { trenchId }),
  ]);
  return {
    trenches: trenches.filter((t) => !trenchId || t.id === trenchId),
    contexts: contexts.filter((c) => c.extent && inScope(c)),
    finds: () => findsByNumber(db, site.id, { trenchId }),
    samples: samples.filter((s) => s.x !== null && s.y !== null),
  };
}

function polygon(outline: PolygonJson | null, t: Transform): GpkgFeature["geometry"] | null {
  const rings = outline ? exportPolygon(outline, t) : null;
  return rings ? { type: "Polygon", rings: rings.map((r) => r.map((p) => [p[0], p[1]] as [number, number])) } : null;
}

const withGeometry = (list: (GpkgFeature | null)[]) => list.filter((f): f is GpkgFeature => f !== null);

const SUFFIX: Record<CoordSpace, string> = { grid: "site_grid", crs: "projected", lonlat: "wgs84" };

/** The four layers (trenches, context extents, finds, samples) in one coordinate space. */
function layersIn(site: Site, space: CoordSpace, srs: GpkgSrs, d: GisData): GpkgLayer[] {
  const t = makeTransform(site, space);
  const where = `${site.code}, in ${srs.name}`;
  const layer = (kind: string, what: string, rest: Omit<GpkgLayer, "name" | "description" | "srsId">): GpkgLayer => ({
    name: `${kind}_${SUFFIX[space]}`,
    description: `${what} of ${where}`,
    srsId: srs.srsId,
    ...rest,
  });
  return [
    layer("trenches", "Trench outlines (baulks as holes)", {
      geometryType: "POLYGON",
      optionalZ: false,
      fields: [
        { name: "code", type: "TEXT" },
        { name: "name", type: "TEXT" },
        { name: "signed_off", type: "BOOLEAN" },
      ],
      features: withGeometry(
        d.trenches.map((tr) => {
          const geometry = polygon(tr.outline, t);
          return geometry && { geometry, properties: { code: tr.code, name: tr.name, signed_off: !!tr.signedOffAt } };
        }),
      ),
    }),
    layer("contexts", "Context extents", {
      geometryType: "POLYGON",
      optionalZ: false,
      fields: [
        { name: "number", type: "INTEGER" },
        { name: "trench", type: "TEXT" },
        { name: "type", type: "TEXT" },
        { name: "state", type: "TEXT" },
      ],
      features: withGeometry(
        d.contexts.map((c) => {
          const geometry = polygon(c.extent, t);
          return (
            geometry && {
              geometry,
              properties: { number: c.number, trench: c.trenchCode, type: c.type, state: c.state },
            }
          );
        }),
      ),
    }),
    layer("finds", "Finds (z and rl: reduced level, metres against the site datum)", {
      geometryType: "POINT",
      optionalZ: true,
      fields: [
        { name: "number", type: "INTEGER" },
        { name: "trench", type: "TEXT" },
        { name: "context", type: "INTEGER" },
        { name: "class", type: "TEXT" },
        { name: "class_label", type: "TEXT" },
        { name: "rl", type: "REAL" },
        { name: "count", type: "INTEGER" },
        { name: "weight_g", type: "REAL" },
        { name: "description", type: "TEXT" },
        { name: "recorded_at", type: "DATETIME" },
      ],
      features: each(d.finds(), (f): GpkgFeature => {
        const [x, y] = t(f.x, f.y);
        return {
          geometry: { type: "Point", x, y, z: f.z },
          properties: {
            number: f.number,
            trench: f.trenchCode,
            context: f.contextNumber,
            class: f.classCode,
            class_label: f.classLabel,
            rl: f.z,
            count: f.count,
            weight_g: f.weightG,
            description: f.description,
            recorded_at: f.recordedAt.toISOString(),
          },
        };
      }),
    }),
    layer("samples", "Samples where their position was taken", {
      geometryType: "POINT",
      optionalZ: true,
      fields: [
        { name: "number", type: "INTEGER" },
        { name: "trench", type: "TEXT" },
        { name: "context", type: "INTEGER" },
        { name: "type", type: "TEXT" },
        { name: "rl", type: "REAL" },
        { name: "volume_l", type: "REAL" },
        { name: "purpose", type: "TEXT" },
        { name: "status", type: "TEXT" },
        { name: "taken_on", type: "DATE" },
      ],
      features: d.samples.map((s) => {
        const [x, y] = t(s.x ?? 0, s.y ?? 0);
        return {
          geometry: { type: "Point", x, y, z: s.z },
          properties: {
            number: s.number,
            trench: s.trenchCode,
            context: s.contextNumber,
            type: s.type,
            rl: s.z,
            volume_l: s.volumeL,
            purpose: s.purpose,
            status: s.status,
            taken_on: s.takenOn,
          },
        };
      }),
    }),
  ];
}

/**
 * The site's GIS data as one GeoPackage: every layer in the site grid (a local engineering CRS), and, when
 * the site is placed, the same layers in its projected CRS (when that is given as WKT) and in WGS 84.
 * `withFinds: false` leaves the finds layers out (their rows are read lazily, so they are then never read): a
 * GeoPackage is built in memory (SQLite as WebAssembly), and the deposition package, whose memory must not
 * grow with the site, carries the finds in its paged register and GeoJSON instead.
 */
export async function siteGeoPackage(
  db: Db,
  site: Site,
  trenchId?: string,
  { withFinds = true }: { withFinds?: boolean } = {},
): Promise<Uint8Array> {
  const data = await readGisData(db, site, trenchId);
  const grid = siteGridSrs(site);
  const spaces: [CoordSpace, GpkgSrs][] = [["grid", grid]];
  if (site.crs?.trim()) {
    const projected = projectedSrs(site);
    if (projected) spaces.push(["crs", projected]);
    spaces.push(["lonlat", WGS84_SRS]);
  }
  return writeGeoPackage(
    spaces.map(([, srs]) => srs),
    spaces.flatMap(([space, srs]) =>
      layersIn(site, space, srs, data).filter((l) => withFinds || !l.name.startsWith("finds_")),
    ),
  );
}

/** The GeoPackage download of the whole site, or of one trench (`.gpkg`, media type from OGC's registration). */
export async function exportGeoPackage(db: Db, site: Site, q: z.infer<typeof exportGisQuery>): Promise<Response> {
  const trench = q.trenchId ? await getTrench(db, site.id, q.trenchId) : null;
  const bytes = await siteGeoPackage(db, site, trench?.id);
  const scope = trench ? `trench-${trench.code}` : "site";
  const day = new Date().toISOString().slice(0, 10);
  return download(bytes, `${site.code}-gis-${scope}-${day}.gpkg`, "application/geopackage+sqlite3");
}
