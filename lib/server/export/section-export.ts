import "server-only";
import sharp from "sharp";
import type { z } from "zod";
import type { Db } from "@/db/client";
import type { Site } from "@/db/schema";
import { sectionCsvRows, sectionSvg } from "@/lib/levels/section-figure";
import type { sectionExportQuery } from "@/lib/schemas/section";
import { getSection, sectionFigure } from "../sections";
import { getTrench } from "../trenches";
import { toCsv, type CsvColumn } from "./csv";
import { download } from "./files";

/**
 * along_m: metres along the line from its start; offset_m: metres off it (+ left of start→end); z_rl_m: reduced
 * level.
 */
const columns: readonly CsvColumn[] = [
  ["number", "number"],
  ["context", "number"],
  ["class", "text"],
  ["along_m", "number"],
  ["offset_m", "number"],
  ["z_rl_m", "number"],
];

export const sectionTitle = (trenchCode: string, name: string) => `Trench ${trenchCode}, section ${name}`;

/** A saved section as SVG (each find a <g data-find>), PNG rendered from that SVG, or CSV of the finds drawn. */
export async function exportSection(
  db: Db,
  site: Site,
  trenchId: string,
  sectionId: string,
  q: z.infer<typeof sectionExportQuery>,
): Promise<Response> {
  const trench = await getTrench(db, site.id, trenchId);
  const section = await getSection(db, site.id, trench.id, sectionId);
  const fig = await sectionFigure(db, site, trench, section);
  const name = `${site.code}-${trench.code}-section-${section.name}`;
  if (q.format === "csv")
    return download(
      toCsv(
        columns,
        sectionCsvRows(fig).map((r) => [r.number, r.context, r.class, r.along_m, r.offset_m, r.z_rl_m]),
      ),
      `${name}.csv`,
      "text/csv; charset=utf-8",
    );
  const svg = sectionSvg(fig, { title: sectionTitle(trench.code, section.name), datumName: site.datumName });
  if (q.format === "svg") return download(svg, `${name}.svg`, "image/svg+xml");
  const png = await sharp(Buffer.from(svg), { density: 144 }).png().toBuffer();
  return download(new Uint8Array(png), `${name}.png`, "image/png");
}
