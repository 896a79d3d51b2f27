import proj4 from "proj4";
import { z } from "zod";
import "./messages";
import { numeric, roleSchema } from "./common";
import { DEFAULT_LEVEL_SPREAD_CAUTION } from "@/lib/levels/vertical-spread";

/**
 * True when proj4 can read the definition (a proj4 string, or OGC WKT as the EPSG registry publishes it) and
 * it is a projection in metres (not longitude/latitude).
 */
function isProjectedDefinition(def: string): boolean {
  try {
    const p = proj4.Proj(def) as unknown as { projName?: string; units?: string };
    return p.projName !== "longlat" && (p.units === undefined || ["m", "meter", "metre"].includes(p.units));
  } catch {
    return false;
  }
}

const siteFields = {
  code: z
    .string()
    .trim()
    .min(2, "A site code needs at least 2 characters.")
    .max(20)
    .regex(/^[A-Za-z0-9-]+$/, "Use letters, digits and hyphens only."),
  name: z.string().trim().min(1, "Give the site a name.").max(200),
  gridDescription: z.string().trim().max(2000),
  gridOriginX: numeric(z.number({ error: "Enter the origin's easting in metres." }).finite()),
  gridOriginY: numeric(z.number({ error: "Enter the origin's northing in metres." }).finite()),
  crs: z
    .string()
    .trim()
    .max(2000)
    .transform((v) => (v === "" ? null : v))
    .nullish()
    .refine(
      (v) => !v || isProjectedDefinition(v),
      "Not a projected CRS in metres: give its OGC WKT (PROJCS[…]) or a proj4 definition (+proj=tmerc … +units=m).",
    ),
  samplesShareFindNumbers: z.boolean({ error: "Say whether samples share the finds' numbers (true or false)." }),
  /** How many find or context numbers a device reserves at once for recording offline. */
  numberBlockSize: numeric(
    z
      .number({ error: "Enter how many numbers a device reserves at once." })
      .int("A block size is a whole number.")
      .min(5, "A block holds at least 5 numbers.")
      .max(1000, "A block holds at most 1,000 numbers."),
  ),
  /** Vertical spread (m) of one class's finds above which a Patterns scope is cautioned as mixing surfaces. */
  levelSpreadCaution: numeric(
    z
      .number({ error: "Enter the vertical spread in metres, e.g. 0.20." })
      .gt(0, "The spread must be more than 0 m.")
      .max(10, "The spread is at most 10 m."),
  ),
  /** Printed in front of label codes so any phone camera opens the record; blank = the code alone. */
  labelAddress: z
    .string()
    .trim()
    .max(200, "The address is at most 200 characters.")
    .transform((v) => (v === "" ? null : v.replace(/\/+$/, "")))
    .nullish()
    .refine(
      (v) => !v || /^https?:\/\/[^\s/?#]+(\/[^\s?#]*)?$/i.test(v),
      "Give the address Loamwork is reached at, e.g. https://loamwork.example.org (no query or #).",
    ),
};

export const siteCreateSchema = z.object({
  ...siteFields,
  gridDescription: siteFields.gridDescription.default(""),
  gridOriginX: siteFields.gridOriginX.default(0),
  gridOriginY: siteFields.gridOriginY.default(0),
  samplesShareFindNumbers: siteFields.samplesShareFindNumbers.default(false),
  numberBlockSize: siteFields.numberBlockSize.default(50),
  levelSpreadCaution: siteFields.levelSpreadCaution.default(DEFAULT_LEVEL_SPREAD_CAUTION),
});

/** No defaults here: a field left out stays as it is. The code never changes. */
export const siteUpdateSchema = z.object(siteFields).omit({ code: true }).partial();

export const memberRoleSchema = z.object({ role: roleSchema });

export type SiteCreate = z.infer<typeof siteCreateSchema>;
export type SiteUpdate = z.infer<typeof siteUpdateSchema>;
