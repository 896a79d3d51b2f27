import type { ImportField, ImportMapping } from "@/lib/schemas/import";

/** Header spellings Loamwork recognises for each field, tried in order (its own export's names first). */
const patterns: [ImportField, RegExp][] = [
  // A station's point ID is not a find number: it is kept in its own field, and only a column that says it
  // holds find numbers is taken for them.
  ["stationPoint", /^(pt|pt[ _-]?(id|no|name)|point|point[ _-]?(id|no|name|number)|station[ _-]?point|shot|id|name)$/i],
  ["number", /^(number|find|find[ _-]?(no|number)|small[ _-]?find([ _-]?(no|number))?)$/i],
  ["x", /^(x|east|easting|e)$/i],
  ["y", /^(y|north|northing|n)$/i],
  // A depth below a surface is not a reduced level: it is never taken for z without being mapped on purpose.
  ["z", /^(z|z_rl_m|rl|reduced_level|level|elev|elevation|height|h)$/i],
  ["classCode", /^(class|class[ _-]?code|code|type)$/i],
  ["contextNumber", /^(context|ctx|context[ _-]?(no|number)|layer)$/i],
  ["count", /^(count|qty|quantity|n[ _-]?items)$/i],
  ["weightG", /^(weight|weight[ _-]?g|wt|grams)$/i],
  ["description", /^(description|desc|note|notes|remark|remarks)$/i],
];

/** A first guess at the mapping from the file's headers, for a site that has none remembered. */
export function guessMapping(headers: string[]): Partial<ImportMapping> {
  const out: Partial<Record<ImportField, string>> = {};
  const taken = new Set<string>();
  for (const [field, re] of patterns) {
    const hit = headers.find((h) => !taken.has(h) && re.test(h.trim()));
    if (hit) {
      out[field] = hit;
      taken.add(hit);
    }
  }
  return out;
}
