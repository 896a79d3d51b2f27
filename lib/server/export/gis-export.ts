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
import {
  WGS84_SRS,
  writeGeoPackage,
  type GpkgFeature,
  type GpkgField,
  type GpkgGeometry,
  type GpkgLayer,
  type GpkgSrs,
  type GpkgValue,
} from "./geopackage";
import { projectedSrs, siteGridSrs } from "./gis-srs";

type GisData = {
  trenches: Awaited<ReturnType<typeof listTrenches>>;
  contexts: Awaited<ReturnType<typeof contextsForExport>>;
  /** The finds, read again for each layer a page at a time: a site can hold tens of thousands. */
  finds: () => AsyncIterable<RegisterRow[]>;
  samples: Awaited<ReturnType<typeof allSamples>>;
};

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

function polygon(outline: PolygonJson | null, t: Transform): GpkgGeometry | null {
  const rings = outline ? exportPolygon(outline, t) : null;
  return rings ? { type: "Polygon", rings: rings.map((r) => r.map((p) => [p[0], p[1]] as [number, number])) } : null;
}

function point(x: number, y: number, z: number | null, t: Transform): GpkgGeometry {
  const [px, py] = t(x, y);
  return { type: "Point", x: px, y: py, z };
}

/** A column of a layer: its field and how a row fills it in. */
type Column<R> = GpkgField & { value: (row: R) => GpkgValue };

/** One layer as the table below states it, the same in every coordinate space. */
type LayerSpec<R> = {
  kind: string;
  what: string;
  geometryType: GpkgLayer["geometryType"];
  /** Points may carry a z (the reduced level). */
  optionalZ: boolean;
  /** The rows, as a list or a page at a time. */
  rows: (d: GisData) => R[] | AsyncIterable<R[]>;
  /** The row's shape in this space, or null for a row with none (it is left out of the layer). */
  geometry: (row: R, t: Transform) => GpkgGeometry | null;
  columns: Column<R>[];
};

type LayerDef = Pick<LayerSpec<unknown>, "kind" | "what" | "geometryType" | "optionalZ"> & {
  fields: GpkgField[];
  features: (d: GisData, t: Transform) => GpkgLayer["features"];
};

function defineLayer<R>({ rows, geometry, columns, ...head }: LayerSpec<R>): LayerDef {
  const featureOf = (row: R, t: Transform): GpkgFeature | null => {
    const shape = geometry(row, t);
    return shape && { geometry: shape, properties: Object.fromEntries(columns.map((c) => [c.name, c.value(row)])) };
  };
  return {
    ...head,
    fields: columns.map(({ name, type }) => ({ name, type })),
    features(d, t) {
      const list = rows(d);
      if (Array.isArray(list)) return list.map((row) => featureOf(row, t)).filter((f) => f !== null);
      return (async function* () {
        for await (const page of list)
          for (const row of page) {
            const feature = featureOf(row, t);
            if (feature) yield feature;
          }
      })();
    },
  };
}

type Trench = GisData["trenches"][number];
type ContextRow = GisData["contexts"][number];
type Sample = GisData["samples"][number];

/** The four layers: trenches, context extents, finds and samples. */
const LAYERS: LayerDef[] = [
  defineLayer<Trench>({
    kind: "trenches",
    what: "Trench outlines (baulks as holes)",
    geometryType: "POLYGON",
    optionalZ: false,
    rows: (d) => d.trenches,
    geometry: (tr, t) => polygon(tr.outline, t),
    columns: [
      { name: "code", type: "TEXT", value: (tr) => tr.code },
      { name: "name", type: "TEXT", value: (tr) => tr.name },
      { name: "signed_off", type: "BOOLEAN", value: (tr) => !!tr.signedOffAt },
    ],
  }),
  defineLayer<ContextRow>({
    kind: "contexts",
    what: "Context extents",
    geometryType: "POLYGON",
    optionalZ: false,
    rows: (d) => d.contexts,
    geometry: (c, t) => polygon(c.extent, t),
    columns: [
      { name: "number", type: "INTEGER", value: (c) => c.number },
      { name: "trench", type: "TEXT", value: (c) => c.trenchCode },
      { name: "type", type: "TEXT", value: (c) => c.type },
      { name: "state", type: "TEXT", value: (c) => c.state },
    ],
  }),
  defineLayer<RegisterRow>({
    kind: "finds",
    what: "Finds (z and rl: reduced level, metres against the site datum)",
    geometryType: "POINT",
    optionalZ: true,
    rows: (d) => d.finds(),
    geometry: (f, t) => point(f.x, f.y, f.z, t),
    columns: [
      { name: "number", type: "INTEGER", value: (f) => f.number },
      { name: "trench", type: "TEXT", value: (f) => f.trenchCode },
      { name: "context", type: "INTEGER", value: (f) => f.contextNumber },
      { name: "class", type: "TEXT", value: (f) => f.classCode },
      { name: "class_label", type: "TEXT", value: (f) => f.classLabel },
      { name: "rl", type: "REAL", value: (f) => f.z },
      { name: "count", type: "INTEGER", value: (f) => f.count },
      { name: "weight_g", type: "REAL", value: (f) => f.weightG },
      { name: "description", type: "TEXT", value: (f) => f.description },
      { name: "recorded_at", type: "DATETIME", value: (f) => f.recordedAt.toISOString() },
    ],
  }),
  defineLayer<Sample>({
    kind: "samples",
    what: "Samples where their position was taken",
    geometryType: "POINT",
    optionalZ: true,
    rows: (d) => d.samples,
    geometry: (s, t) => point(s.x ?? 0, s.y ?? 0, s.z, t),
    columns: [
      { name: "number", type: "INTEGER", value: (s) => s.number },
      { name: "trench", type: "TEXT", value: (s) => s.trenchCode },
      { name: "context", type: "INTEGER", value: (s) => s.contextNumber },
      { name: "type", type: "TEXT", value: (s) => s.type },
      { name: "rl", type: "REAL", value: (s) => s.z },
      { name: "volume_l", type: "REAL", value: (s) => s.volumeL },
      { name: "purpose", type: "TEXT", value: (s) => s.purpose },
      { name: "status", type: "TEXT", value: (s) => s.status },
      { name: "taken_on", type: "DATE", value: (s) => s.takenOn },
    ],
  }),
];

const SUFFIX: Record<CoordSpace, string> = { grid: "site_grid", crs: "projected", lonlat: "wgs84" };

/** The layers of the table in one coordinate space. */
function layersIn(site: Site, space: CoordSpace, srs: GpkgSrs, d: GisData, defs: LayerDef[]): GpkgLayer[] {
  const t = makeTransform(site, space);
  return defs.map(({ kind, what, features, ...rest }) => ({
    ...rest,
    name: `${kind}_${SUFFIX[space]}`,
    description: `${what} of ${site.code}, in ${srs.name}`,
    srsId: srs.srsId,
    features: features(d, t),
  }));
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
  const defs = LAYERS.filter((l) => withFinds || l.kind !== "finds");
  return writeGeoPackage(
    spaces.map(([, srs]) => srs),
    spaces.flatMap(([space, srs]) => layersIn(site, space, srs, data, defs)),
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
