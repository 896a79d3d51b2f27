import "server-only";
import { strToU8 } from "fflate";
import type { z } from "zod";
import type { Db } from "@/db/client";
import type { depositionQuery } from "@/lib/schemas/export";
import { badInput } from "@/lib/server/errors";
import type { SiteActor } from "@/lib/server/membership";
import { userNames } from "@/lib/server/reads/user-names";
import { getTrench } from "@/lib/server/trenches";
import { loadFile } from "@/lib/server/uploads/file-store";
import { PHOTO_MAX_BYTES } from "@/lib/server/uploads/photo-limits";
import { fetchUpload } from "@/lib/server/uploads/remote";
import { bagZipStream, type BagFile } from "./bagit";
import { allFinds } from "@/lib/server/finds";
import { findsGeoJson } from "./geojson";
import { drawSiteMatrix } from "./matrix-image";
import { packageReadme, type ReadmeRegister } from "./package-readme";
import {
  benchmarksRegister,
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
} from "./package-registers";

const safeName = (s: string) => s.replace(/[^\w.-]+/g, "_").slice(0, 80);

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

/**
 * The files of the package under data/, produced one at a time as the zip asks for them: the registers,
 * the matrix, GeoJSON (when the site is placed in a CRS), the photos, the analysis runs, and last a readme
 * that describes them all.
 */
async function* payload(
  db: Db,
  actor: SiteActor,
  scope: PackageScope,
  trenchCode: string | undefined,
  exporter: string,
) {
  const site = actor.site;
  const registers: ReadmeRegister[] = [];
  const other: [string, string][] = [];
  const csvFile = (r: PackageRegister): BagFile => {
    registers.push(r);
    return { path: `registers/${r.file}`, bytes: strToU8(r.csv) };
  };
  yield csvFile(await trenchesRegister(db, scope));
  yield csvFile(await contextsRegister(db, scope, trenchCode));
  yield csvFile(await relationsRegister(db, scope));
  yield csvFile(await classesRegister(db, scope));
  yield csvFile(await findsRegister(db, scope));
  yield csvFile(await samplesRegister(db, scope));
  yield csvFile(await drawingsRegister(db, scope));
  yield csvFile(await levelsRegister(db, scope));
  yield csvFile(await benchmarksRegister(db, scope));

  const { drawing } = await drawSiteMatrix(db, site.id, scope.trenchId, false);
  other.push(["matrix/matrix.svg", "the stratigraphic matrix as drawn by Loamwork (SVG)"]);
  yield { path: "matrix/matrix.svg", bytes: strToU8(drawing.svg) };

  if (site.crs) {
    const found = await allFinds(db, site.id, { trenchId: scope.trenchId, sort: "number", dir: "asc" });
    other.push(["gis/finds-wgs84.geojson", "finds as points, WGS 84 longitude/latitude (RFC 7946)"]);
    yield { path: "gis/finds-wgs84.geojson", bytes: strToU8(JSON.stringify(findsGeoJson(site, "lonlat", found))) };
  } else {
    other.push(["gis/", "none: the site has no CRS set, so no real-world coordinates could be given"]);
  }

  const list = await packagePhotos(db, scope);
  const placed = new Map<string, { path: string; copy: string }>();
  for (const p of list) {
    const file = await photoFile(p);
    if (!file) continue;
    const path = `files/photos/${p.id.slice(0, 8)}-${safeName(p.fileName)}${file.ext}`;
    placed.set(p.id, { path, copy: file.copy });
    yield { path, bytes: file.bytes, compressed: true };
  }
  yield csvFile(photosRegister(list, placed));
  if (list.length) other.push(["files/photos/", "the photos listed in registers/photos.csv"]);

  const runs = await runsRegister(db, scope);
  yield csvFile(runs.table);
  for (const r of runs.results) yield { path: r.path, bytes: strToU8(r.json) };
  if (runs.results.length) other.push(["analysis/", "each finished analysis run's parameters and result (JSON)"]);

  yield {
    path: "README.txt",
    bytes: strToU8(
      packageReadme({
        siteCode: site.code,
        siteName: site.name,
        scope: trenchCode ? `trench ${trenchCode}` : "the whole site",
        exportedBy: exporter,
        exportedAt: new Date().toISOString(),
        datum: site.datumName,
        registers,
        otherFiles: other,
      }),
    ),
  };
}

/**
 * The deposition package (field.md, "The archive") of the whole site, or of one signed-off trench, as a
 * BagIt bag in one zip, streamed to the director while it is built.
 */
export async function depositionPackage(
  db: Db,
  actor: SiteActor,
  q: z.infer<typeof depositionQuery>,
): Promise<Response> {
  const site = actor.site;
  let trenchCode: string | undefined;
  if (q.trenchId) {
    const trench = await getTrench(db, site.id, q.trenchId);
    if (!trench.signedOffAt)
      throw badInput(
        `Trench ${trench.code} is not signed off yet: export the whole site (its open records are marked), or sign off its last context first.`,
        { trenchId: [`Trench ${trench.code} is not signed off yet.`] },
      );
    trenchCode = trench.code;
  }
  const exporter = (await userNames(db, [actor.userId])).get(actor.userId) ?? "a director";
  const exportedAt = new Date();
  const day = exportedAt.toISOString().slice(0, 10);
  const root = safeName(`${site.code}${trenchCode ? `-${trenchCode}` : ""}-deposition-${day}`);
  const scope: PackageScope = { siteId: site.id, trenchId: q.trenchId };
  const stream = bagZipStream(root, payload(db, actor, scope, trenchCode, exporter), () => [
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
  ]);
  return new Response(stream, {
    headers: {
      "content-type": "application/zip",
      "content-disposition": `attachment; filename="${root}.zip"`,
      "cache-control": "no-store",
      "x-content-type-options": "nosniff",
    },
  });
}
