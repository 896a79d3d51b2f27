import "server-only";
import initSqlJs, { type SqlJsStatic } from "sql.js";
import wkx from "wkx";
import { boundsOf } from "@/lib/geometry/plan-view";

/**
 * An OGC GeoPackage (OGC 12-128r18, version 1.2) written with SQLite compiled to WebAssembly: the three
 * required tables (gpkg_spatial_ref_sys, gpkg_contents, gpkg_geometry_columns) and one feature table per
 * layer. Unlike GeoJSON, each layer names its own coordinate system, so site-grid metres can travel as they are.
 */

/** A row of gpkg_spatial_ref_sys (spec §1.1.2): `definition` is OGC WKT (OGC 01-009). */
export type GpkgSrs = {
  srsId: number;
  name: string;
  organization: string;
  organizationCode: number;
  definition: string;
  description: string;
};

export type GpkgValue = string | number | boolean | null;
export type GpkgField = { name: string; type: "TEXT" | "INTEGER" | "REAL" | "BOOLEAN" | "DATE" | "DATETIME" };
export type GpkgGeometry =
  { type: "Point"; x: number; y: number; z: number | null } | { type: "Polygon"; rings: [number, number][][] };
export type GpkgFeature = { geometry: GpkgGeometry; properties: Record<string, GpkgValue> };

export type GpkgLayer = {
  name: string;
  description: string;
  srsId: number;
  geometryType: "POINT" | "POLYGON";
  /** Whether points may carry a z (gpkg_geometry_columns.z = 2, "optional"). */
  optionalZ: boolean;
  fields: GpkgField[];
  /** Read once, as the layer is written: a large layer can come a page at a time. */
  features: Iterable<GpkgFeature> | AsyncIterable<GpkgFeature>;
};

/** The rows every GeoPackage must hold (spec §1.1.2.1.2): undefined Cartesian, undefined geographic, WGS 84. */
export const WGS84_SRS: GpkgSrs = {
  srsId: 4326,
  name: "WGS 84 geodetic",
  organization: "EPSG",
  organizationCode: 4326,
  // As the GeoPackage specification gives it (Annex F.2 / Table 21).
  definition:
    'GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563,AUTHORITY["EPSG","7030"]],AUTHORITY["EPSG","6326"]],PRIMEM["Greenwich",0,AUTHORITY["EPSG","8901"]],UNIT["degree",0.0174532925199433,AUTHORITY["EPSG","9122"]],AUTHORITY["EPSG","4326"]]',
  description: "longitude/latitude coordinates in decimal degrees on the WGS 84 spheroid",
};
const REQUIRED_SRS: GpkgSrs[] = [
  {
    srsId: -1,
    name: "Undefined cartesian SRS",
    organization: "NONE",
    organizationCode: -1,
    definition: "undefined",
    description: "undefined cartesian coordinate reference system",
  },
  {
    srsId: 0,
    name: "Undefined geographic SRS",
    organization: "NONE",
    organizationCode: 0,
    definition: "undefined",
    description: "undefined geographic coordinate reference system",
  },
  WGS84_SRS,
];

const SCHEMA = `
CREATE TABLE gpkg_spatial_ref_sys (srs_name TEXT NOT NULL, srs_id INTEGER NOT NULL PRIMARY KEY,
  organization TEXT NOT NULL, organization_coordsys_id INTEGER NOT NULL, definition TEXT NOT NULL, description TEXT);
CREATE TABLE gpkg_contents (table_name TEXT NOT NULL PRIMARY KEY, data_type TEXT NOT NULL, identifier TEXT UNIQUE,
  description TEXT DEFAULT '', last_change DATETIME NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')),
  min_x DOUBLE, min_y DOUBLE, max_x DOUBLE, max_y DOUBLE, srs_id INTEGER,
  CONSTRAINT fk_gc_r_srs_id FOREIGN KEY (srs_id) REFERENCES gpkg_spatial_ref_sys(srs_id));
CREATE TABLE gpkg_geometry_columns (table_name TEXT NOT NULL, column_name TEXT NOT NULL,
  geometry_type_name TEXT NOT NULL, srs_id INTEGER NOT NULL, z TINYINT NOT NULL, m TINYINT NOT NULL,
  CONSTRAINT pk_geom_cols PRIMARY KEY (table_name, column_name), CONSTRAINT uk_gc_table_name UNIQUE (table_name),
  CONSTRAINT fk_gc_tn FOREIGN KEY (table_name) REFERENCES gpkg_contents(table_name),
  CONSTRAINT fk_gc_srs FOREIGN KEY (srs_id) REFERENCES gpkg_spatial_ref_sys (srs_id));
`;

/** "GPKG" as the SQLite application id, and version 1.2.0 as the user version (spec §1.1.1.1.1). */
const APPLICATION_ID = 0x47504b47;
const USER_VERSION = 10200;

let sqlite: Promise<SqlJsStatic> | undefined;
const loadSqlite = () => (sqlite ??= initSqlJs());

type Envelope = [minX: number, maxX: number, minY: number, maxY: number];

function envelopeOf(g: GpkgGeometry): Envelope {
  if (g.type === "Point") return [g.x, g.x, g.y, g.y];
  const b = boundsOf(g.rings.flat());
  return [b.minX, b.maxX, b.minY, b.maxY];
}

function wkb(g: GpkgGeometry): Uint8Array {
  const pt = (x: number, y: number) => new wkx.Point(x, y);
  if (g.type === "Point") return g.z === null ? pt(g.x, g.y).toWkb() : new wkx.Point(g.x, g.y, g.z).toWkb();
  const [outer = [], ...holes] = g.rings;
  return new wkx.Polygon(
    outer.map(([x, y]) => pt(x, y)),
    holes.map((ring) => ring.map(([x, y]) => pt(x, y))),
  ).toWkb();
}

/**
 * The GeoPackage geometry blob (spec §2.1.3): "GP", version 0, flags (little-endian; an x/y envelope for
 * polygons, none for points), the srs_id, then the geometry as ISO well-known binary.
 */
export function geometryBlob(g: GpkgGeometry, srsId: number): Uint8Array {
  const envelope = g.type === "Polygon" ? envelopeOf(g) : null;
  const body = wkb(g);
  const out = new Uint8Array(8 + (envelope ? 32 : 0) + body.length);
  const view = new DataView(out.buffer);
  out.set([0x47, 0x50, 0, (envelope ? 1 << 1 : 0) | 1]);
  view.setInt32(4, srsId, true);
  envelope?.forEach((v, k) => view.setFloat64(8 + 8 * k, v, true));
  out.set(body, 8 + (envelope ? 32 : 0));
  return out;
}

const quoted = (name: string) => `"${name.replace(/"/g, '""')}"`;
const sqlValue = (v: GpkgValue) => (typeof v === "boolean" ? (v ? 1 : 0) : v);

/** The whole GeoPackage as bytes. Every SRS a layer names must be in `srs`. */
export async function writeGeoPackage(srs: GpkgSrs[], layers: GpkgLayer[], at = new Date()): Promise<Uint8Array> {
  const SQL = await loadSqlite();
  const db = new SQL.Database();
  try {
    db.run(`PRAGMA application_id = ${APPLICATION_ID}; PRAGMA user_version = ${USER_VERSION};`);
    db.run(SCHEMA);
    db.run("BEGIN");
    const known = new Set<number>();
    for (const s of [...REQUIRED_SRS, ...srs]) {
      if (known.has(s.srsId)) continue;
      known.add(s.srsId);
      db.run("INSERT INTO gpkg_spatial_ref_sys VALUES (?, ?, ?, ?, ?, ?)", [
        s.name,
        s.srsId,
        s.organization,
        s.organizationCode,
        s.definition,
        s.description,
      ]);
    }
    const stamp = at.toISOString();
    for (const layer of layers) {
      if (!known.has(layer.srsId)) throw new Error(`GeoPackage layer ${layer.name}: SRS ${layer.srsId} not listed`);
      const columns = layer.fields.map((f) => `${quoted(f.name)} ${f.type}`).join(", ");
      db.run(
        `CREATE TABLE ${quoted(layer.name)} (fid INTEGER PRIMARY KEY AUTOINCREMENT NOT NULL, geom ${layer.geometryType}${columns ? `, ${columns}` : ""})`,
      );
      const insert = db.prepare(
        `INSERT INTO ${quoted(layer.name)} (geom${layer.fields.map((f) => `, ${quoted(f.name)}`).join("")}) VALUES (?${", ?".repeat(layer.fields.length)})`,
      );
      const box: Envelope = [Infinity, -Infinity, Infinity, -Infinity];
      let written = 0;
      for await (const f of layer.features) {
        written++;
        const e = envelopeOf(f.geometry);
        box[0] = Math.min(box[0], e[0]);
        box[1] = Math.max(box[1], e[1]);
        box[2] = Math.min(box[2], e[2]);
        box[3] = Math.max(box[3], e[3]);
        insert.run([
          geometryBlob(f.geometry, layer.srsId),
          ...layer.fields.map((c) => sqlValue(f.properties[c.name] ?? null)),
        ]);
      }
      insert.free();
      const has = written > 0;
      db.run("INSERT INTO gpkg_contents VALUES (?, 'features', ?, ?, ?, ?, ?, ?, ?, ?)", [
        layer.name,
        layer.name,
        layer.description,
        stamp,
        has ? box[0] : null,
        has ? box[2] : null,
        has ? box[1] : null,
        has ? box[3] : null,
        layer.srsId,
      ]);
      db.run("INSERT INTO gpkg_geometry_columns VALUES (?, 'geom', ?, ?, ?, 0)", [
        layer.name,
        layer.geometryType,
        layer.srsId,
        layer.optionalZ ? 2 : 0,
      ]);
    }
    db.run("COMMIT");
    return db.export();
  } finally {
    db.close();
  }
}
