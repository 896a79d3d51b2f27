import "server-only";
import type { Db } from "@/db/client";
import type { Site } from "@/db/schema";
import { badInput } from "@/lib/server/errors";
import { findsByNumber } from "@/lib/server/finds";
import { userNames } from "@/lib/server/reads/user-names";
import { getTrench, listTrenches } from "@/lib/server/trenches";
import { loadFile } from "@/lib/server/uploads/file-store";
import { PHOTO_MAX_BYTES } from "@/lib/server/uploads/photo-limits";
import { fetchUpload } from "@/lib/server/uploads/remote";
import type { z } from "zod";
import type { depositionQuery } from "@/lib/schemas/export";
import type { SiteActor } from "@/lib/server/membership";
import { bagZip, bagZipStream, type BagFile, type BagInfoLines, type BagSummary } from "./bagit";
import { findsGeoJson } from "./geojson";
import { siteGeoPackage } from "./gis-export";
import { projectedSrs } from "./gis-srs";
import { readTrenchRecord } from "./trench-record-data";
import { trenchRecordPdf } from "./trench-record-pdf";
import { drawSiteMatrix } from "./matrix-image";
import { packageReadme, type ReadmeRegister } from "./package-readme";
import {
  benchmarksRegister,
  boxesRegister,
  classesRegister,
  contextsRegister,
  drawingsRegister,
  findsRegister,
  levelsRegister,
  packagePhotos,
  photosRegister,
  relationsRegister,
  runsRegister,
  samplesRegister,
  trenchesRegister,
  type PackagePhoto,
  type PackageRegister,
  type PackageScope,
  type StreamedRegister,
} from "./package-registers";

const safeName = (s: string) => s.replace(/[^\w.-]+/g, "_").slice(0, 80);
const utf8 = (s: string) => new TextEncoder().encode(s);

/**
 * One file of the package under data/, made only when the zip reaches it (so at most one file, or one
 * page of a large register, is held at a time); null leaves it out (a photo whose file is gone).
 */
export type PackageEntry = () => Promise<BagFile | null>;

/**
 * Everything the package will hold, known before any of it is read: the list of entries (so a job can
 * report files done out of the total), the bag's folder name, and what bag-info.txt says.
 */
export type PackagePlan = {
  /** The bag's top folder, and the zip's name without ".zip". */
  root: string;
  trenchCode: string | null;
  entries: PackageEntry[];
  info: (summary: Omit<BagSummary, "fingerprint">) => BagInfoLines;
};

/** The photo's original from the upload service when it can be had, else Loamwork's display copy. */
async function photoFile(
  p: PackagePhoto,
): Promise<{ bytes: Uint8Array; copy: "original" | "display"; ext: string } | null> {
  if (process.env.UPLOADTHING_TOKEN) {
    try {
      const bytes = await fetchUpload(p.fileKey, PHOTO_MAX_BYTES);
      return { bytes, copy: "original", ext: "" };
    } catch {
      // Not at the service (a seeded photo, or the service is away): the display copy stands in.
    }
  }
  const display = p.displayPath ? await loadFile(p.displayPath) : null;
  return display ? { bytes: display, copy: "display", ext: ".jpg" } : null;
}

/** The finds as GeoJSON points in WGS 84, written a page of finds at a time. */
async function* findsGeoJsonChunks(db: Db, site: Site, trenchId: string | undefined) {
  const empty = JSON.stringify(findsGeoJson(site, "lonlat", []));
  // "features" is the collection's last member: the features go between its brackets.
  if (!empty.endsWith(`"features":[]}`)) throw new Error("GeoJSON export: features must be the last member");
  yield utf8(empty.slice(0, -2));
  let first = true;
  for await (const page of findsByNumber(db, site.id, { trenchId })) {
    const features = JSON.stringify(findsGeoJson(site, "lonlat", page).features).slice(1, -1);
    if (!features) continue;
    yield utf8(first ? features : `,${features}`);
    first = false;
  }
  yield utf8("]}");
}

/** A package is of the whole site (null) or of one signed-off trench (its code); any other trench is refused. */
export async function packageTrenchCode(db: Db, site: Site, trenchId: string | undefined): Promise<string | null> {
  if (!trenchId) return null;
  const trench = await getTrench(db, site.id, trenchId);
  if (!trench.signedOffAt)
    throw badInput(
      `Trench ${trench.code} is not signed off yet: export the whole site (its open records are marked), or sign off its last context first.`,
      { trenchId: [`Trench ${trench.code} is not signed off yet.`] },
    );
  return trench.code;
}

/**
 * The deposition package (field.md, "The archive") of the whole site, or of one signed-off trench: the
 * registers, the matrix, a GeoPackage (and GeoJSON when the site is placed in a CRS), the photos, the
 * analysis runs, and last a readme that describes them all. Refuses a trench that is not signed off.
 */
export async function planPackage(db: Db, site: Site, userId: string, trenchId?: string): Promise<PackagePlan> {
  const trenchCode = await packageTrenchCode(db, site, trenchId);
  const exporter = (await userNames(db, [userId])).get(userId) ?? "a director";
  const exportedAt = new Date();
  const day = exportedAt.toISOString().slice(0, 10);
  const root = safeName(`${site.code}${trenchCode ? `-${trenchCode}` : ""}-deposition-${day}`);
  const scope: PackageScope = { siteId: site.id, trenchId };

  const registers: ReadmeRegister[] = [];
  const other: [string, string][] = [];
  const csv =
    (make: () => Promise<PackageRegister> | PackageRegister): PackageEntry =>
    async () => {
      const r = await make();
      registers.push(r);
      return { path: `registers/${r.file}`, bytes: utf8(r.csv) };
    };
  const streamed =
    (make: () => StreamedRegister): PackageEntry =>
    async () => {
      const r = make();
      async function* chunks() {
        yield* r.chunks;
        registers.push(r.meta);
      }
      return { path: `registers/${r.meta.file}`, bytes: chunks() };
    };

  const entries: PackageEntry[] = [
    csv(() => trenchesRegister(db, scope)),
    csv(() => contextsRegister(db, scope, trenchCode ?? undefined)),
    csv(() => relationsRegister(db, scope)),
    csv(() => classesRegister(db, scope)),
    streamed(() => findsRegister(db, scope)),
    csv(() => samplesRegister(db, scope)),
    csv(() => boxesRegister(db, scope)),
    csv(() => drawingsRegister(db, scope)),
    csv(() => levelsRegister(db, scope)),
    csv(() => benchmarksRegister(db, scope)),
    async () => {
      const { drawing } = await drawSiteMatrix(db, site.id, trenchId, false);
      other.push(["matrix/matrix.svg", "the stratigraphic matrix as drawn by Loamwork (SVG)"]);
      return { path: "matrix/matrix.svg", bytes: utf8(drawing.svg) };
    },
  ];

  // The trench record of each trench in the package, as a PDF.
  const inScope = (await listTrenches(db, site.id)).filter((t) => !trenchId || t.id === trenchId);
  for (const trench of inScope)
    entries.push(async () => {
      const path = `records/trench-${safeName(trench.code)}.pdf`;
      return { path, bytes: await trenchRecordPdf(await readTrenchRecord(db, site, trench, exportedAt)) };
    });
  if (inScope.length)
    other.push([
      "records/",
      "each trench's record as PDF: summary, sign-off, plan, context sheets, finds by context and class",
    ]);

  entries.push(async () => {
    const projected = projectedSrs(site);
    const layers = !site.crs
      ? "in the site grid (a local engineering CRS); the site is not placed, so no real-world layers"
      : `in the site grid (a local engineering CRS)${projected ? `, in ${projected.name}` : ""} and in WGS 84`;
    other.push([
      "gis/site.gpkg",
      `trenches, context extents and samples as an OGC GeoPackage, ${layers}; the finds are in the finds ` +
        "register (site-grid x, y and RL) and, when the site is placed, in gis/finds-wgs84.geojson",
    ]);
    return { path: "gis/site.gpkg", bytes: await siteGeoPackage(db, site, trenchId, { withFinds: false }) };
  });
  if (site.crs) {
    entries.push(async () => {
      other.push(["gis/finds-wgs84.geojson", "finds as points, WGS 84 longitude/latitude (RFC 7946)"]);
      return { path: "gis/finds-wgs84.geojson", bytes: findsGeoJsonChunks(db, site, trenchId) };
    });
  }

  const photoList = await packagePhotos(db, scope);
  const placed = new Map<string, { path: string; copy: string }>();
  for (const p of photoList)
    entries.push(async () => {
      const file = await photoFile(p);
      if (!file) return null;
      const path = `files/photos/${p.id.slice(0, 8)}-${safeName(p.fileName)}${file.ext}`;
      placed.set(p.id, { path, copy: file.copy });
      return { path, bytes: file.bytes, compressed: true };
    });
  entries.push(csv(() => photosRegister(photoList, placed)));
  if (photoList.length) other.push(["files/photos/", "the photos listed in registers/photos.csv"]);

  const runs = await runsRegister(db, scope);
  entries.push(csv(() => runs.table));
  for (const r of runs.results) entries.push(async () => ({ path: r.path, bytes: utf8(r.json) }));
  if (runs.results.length) other.push(["analysis/", "each finished analysis run's parameters and result (JSON)"]);

  // Last: the readme describes what the entries before it wrote.
  entries.push(async () => ({
    path: "README.txt",
    bytes: utf8(
      packageReadme({
        siteCode: site.code,
        siteName: site.name,
        scope: trenchCode ? `trench ${trenchCode}` : "the whole site",
        exportedBy: exporter,
        exportedAt: exportedAt.toISOString(),
        datum: site.datumName,
        registers,
        otherFiles: other,
      }),
    ),
  }));

  const info = (): BagInfoLines => [
    ["Source-Organization", site.name],
    ["External-Identifier", site.code],
    [
      "External-Description",
      `Excavation archive of ${site.code} ${site.name}: ${trenchCode ? `trench ${trenchCode}` : "the whole site"}`,
    ],
    ["Bagging-Date", day],
    ["Contact-Name", exporter],
    ["Site-Code", site.code],
    ["Trench", trenchCode ?? "all"],
    ["Exported-By", exporter],
    ["Exported-At", exportedAt.toISOString()],
  ];
  return { root, trenchCode, entries, info };
}

/**
 * The plan's files in order, each made when the zip asks for it. `progress` hears (done, total) after
 * each entry is in the zip (or left out).
 */
export async function* packageFiles(
  plan: PackagePlan,
  progress?: (done: number, total: number) => void,
): AsyncGenerator<BagFile> {
  const total = plan.entries.length;
  let done = 0;
  for (const entry of plan.entries) {
    const file = await entry();
    // The zip asks for the next file only once this one is written: resuming here means it is in.
    if (file) yield file;
    progress?.(++done, total);
  }
}

/**
 * The package streamed straight to the director while it is built (no file kept): for scripts and small
 * sites; a package job writes the same bytes to a file, with progress.
 */
export async function depositionPackage(
  db: Db,
  actor: SiteActor,
  q: z.infer<typeof depositionQuery>,
): Promise<Response> {
  const plan = await planPackage(db, actor.site, actor.userId, q.trenchId);
  const stream = bagZipStream(bagZip(plan.root, packageFiles(plan), plan.info));
  return new Response(stream, {
    headers: {
      "content-type": "application/zip",
      "content-disposition": `attachment; filename="${plan.root}.zip"`,
      "cache-control": "no-store",
      "x-content-type-options": "nosniff",
    },
  });
}
