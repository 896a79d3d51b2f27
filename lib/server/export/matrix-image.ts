import "server-only";
import sharp from "sharp";
import type { z } from "zod";
import type { Db } from "@/db/client";
import type { Site } from "@/db/schema";
import { siteMatrix } from "@/lib/server/relations";
import { download } from "./files";
import { drawMatrix } from "./matrix-svg";
import type { matrixImageQuery } from "@/lib/schemas/export";

/** The drawn matrix of a site (or one trench), with a link on every context to its sheet. */
export async function drawSiteMatrix(db: Db, siteId: string, trenchId?: string, links = true) {
  const m = await siteMatrix(db, siteId, trenchId);
  const info = new Map(m.contexts.map((c) => [c.id, { type: c.type, state: c.state }]));
  const drawing = drawMatrix(m, info, links ? (id) => `/sites/${siteId}/contexts/${id}` : undefined);
  return { matrix: m, drawing };
}

/** SVG as drawn, or PNG rendered from that same SVG by sharp (librsvg) at twice the size for print. */
export async function matrixImage(db: Db, site: Site, q: z.infer<typeof matrixImageQuery>): Promise<Response> {
  const { drawing } = await drawSiteMatrix(db, site.id, q.trenchId, false);
  const name = `${site.code}-matrix-${new Date().toISOString().slice(0, 10)}`;
  if (q.format === "svg") return download(drawing.svg, `${name}.svg`, "image/svg+xml");
  const png = await sharp(Buffer.from(drawing.svg), { density: 144 }).png().toBuffer();
  return download(new Uint8Array(png), `${name}.png`, "image/png");
}
