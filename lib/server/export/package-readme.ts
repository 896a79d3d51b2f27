import type { CsvColumn } from "./csv";

/** What each column of the package's registers holds, by column name (the same name means the same thing). */
export const columnMeanings: Record<string, string> = {
  number:
    "the record's number on the site (finds, samples, contexts: each its own sequence unless the site shares them)",
  trench: "trench code",
  context: "context number",
  class: "artefact class code (see classes.csv)",
  x: "easting on the site grid, metres",
  y: "northing on the site grid, metres",
  z_rl_m: "reduced level, metres above the site datum (empty when none was taken)",
  count: "number of pieces",
  weight_g: "weight, grams",
  description: "free text as recorded",
  method: "how the find was recorded: plan (drawn), typed, imported (total station)",
  recorded_by: "who recorded it",
  recorded_at: "when it was recorded (ISO 8601, UTC)",
  station_point: "the total station's own point label, when imported",
  context_state: "state of the record's context: open, awaiting (submitted), signed_off; only signed_off is final",
  processing: "where a find stands after the trench: lifted, washed, marked, bagged, boxed, sent, returned",
  sent_to: "who a sent find went to (a specialist or laboratory), as recorded",
  box: "number of the box the record is kept in (see boxes.csv; empty = not boxed)",
  location: "where the record is kept when its box does not say, as recorded",
  store: "the store a box is in, and the place in it",
  note: "note as recorded",
  samples: "number of samples",
  kind: "plan or section",
  type: "kind of context (layer, fill, cut, structure, deposit) or of sample (bulk, spot, charcoal, …)",
  state: "open, awaiting (submitted for sign-off) or signed_off; only signed_off is final",
  colour: "colour as described",
  compaction: "compaction as described",
  composition: "composition as described",
  inclusions: "inclusions as described",
  interpretation: "interpretation as recorded",
  relations: "the context's relations read from its side, e.g. 'cut by 1005; below 1002'",
  finds: "number of finds",
  has_extent: "yes when the context's extent was drawn on the plan",
  signed_off_at: "when the record was signed off (empty = not signed off)",
  from_context: "context number the relation reads from",
  relation: "above, cuts, fills or same_as, read 'from_context relation to_context'",
  to_context: "context number the relation reads to",
  from_state: "state of from_context (open, awaiting, signed_off)",
  to_state: "state of to_context (open, awaiting, signed_off)",
  spit: "spit number within the context (empty = the context as a whole)",
  volume_l: "volume of the sample, litres",
  purpose: "why the sample was taken",
  taken_by: "who took the sample",
  taken_on: "date taken (YYYY-MM-DD)",
  status: "processing status (samples: taken, processing, processed, sent, discarded; runs: queued … done)",
  code: "the record's code on the site",
  name: "name as recorded",
  surface_rl_m: "reduced level of the ground surface before digging, metres",
  label: "the class as shown on screen",
  material: "material of the class",
  human_remains: "yes for classes of human remains (handled under the licence and local law)",
  run: "identifier of the levelling run or analysis run",
  line: "line of the level book, from 1",
  station: "instrument station of the reading",
  target:
    "what the staff stood on: benchmark, change_point, find, context_top, context_base, spit_top, spit_base, ground, other",
  target_record: "the record the staff stood on, by number",
  level_rl_m: "reduced level, metres above the site datum",
  flagged: "yes when the run closed outside tolerance: use with care",
  run_misclosure_m: "misclosure of the run, metres (empty for an open run)",
  run_within_tolerance: "yes / no against the site's tolerance (empty for an open run)",
  file: "path of the file in this package, under data/",
  copy: "original (as uploaded) or display (Loamwork's JPEG copy, EXIF orientation applied, when the original was not available)",
  file_name: "the file's name when uploaded",
  trench_state: "signed_off or open",
  width_px: "width of the display copy, pixels",
  height_px: "height of the display copy, pixels",
  fitted_to_grid: "yes when the photo was fitted to the site grid as a plan underlay",
  photo_kind: "plan underlay (a trench photo fitted to the grid) or record (an entry of the photo register)",
  photo_number: "the record photo's number in the site's photo register (empty for a plan underlay)",
  photo_of: "what the record photo is of: context, find or trench",
  find_number: "number of the find the photo is of",
  record_state: "state of what the photo is of (its context's, or the trench's): open, awaiting or signed_off",
  facing: "which way the camera faced: a compass point (N, NE, …) or degrees; 'not stated' when none was given",
  facing_degrees: "the same facing in whole degrees clockwise from grid north",
  scale_shown: "the scale laid in the photo as recorded ('1 m', 'none')",
  caption: "the caption as recorded",
  photographer: "who took the photo",
  taken_at: "when the photo was taken (ISO 8601, UTC)",
  taken_at_from: "camera (EXIF): the date the camera wrote in the file; upload time: the file had none",
  uploaded_by: "who uploaded it",
  uploaded_at: "when it was uploaded (ISO 8601, UTC)",
  seed: "seed of the run's random numbers (the run repeats exactly with it)",
  engine_version: "version of Loamwork's statistics engine that computed the run",
  fingerprint: "SHA-256 of the records the run read: a changed record gives another fingerprint",
  created_at: "when the run was asked for",
  finished_at: "when the run finished",
  scale: "the drawing's scale, 1:n",
  contexts: "numbers of the contexts the drawing shows, separated by spaces",
  title: "what the drawing shows, as written on the sheet",
  drawn_by: "who drew it",
  drawn_on: "date drawn (YYYY-MM-DD)",
  result_file: "the run's parameters and result as JSON, under data/ (empty when not finished)",
};

export type ReadmeRegister = { file: string; title: string; columns: readonly CsvColumn[]; rows: number };

/** The package's own description of its layout and of every register's columns, as plain text. */
export function packageReadme(opts: {
  siteCode: string;
  siteName: string;
  scope: string;
  exportedBy: string;
  exportedAt: string;
  datum: string;
  registers: ReadmeRegister[];
  otherFiles: [path: string, what: string][];
}): string {
  const out: string[] = [
    `Deposition package of ${opts.siteCode} ${opts.siteName}: ${opts.scope}`,
    `Exported by ${opts.exportedBy} at ${opts.exportedAt} from Loamwork.`,
    "",
    "This folder is a BagIt bag (RFC 8493). bagit.txt names the version; manifest-sha256.txt gives the SHA-256",
    "of every file under data/; tagmanifest-sha256.txt gives that of the tag files; bag-info.txt says what the",
    "package is, and its Package-Fingerprint is the SHA-256 of manifest-sha256.txt.",
    "",
    "Registers are CSV (RFC 4180, UTF-8, comma separated, CRLF line ends, one header row). A text cell that",
    "starts with = + - @ is prefixed with an apostrophe so spreadsheets do not run it as a formula.",
    `Every z and level is a reduced level in metres above ${opts.datum}; x and y are site-grid metres.`,
    "Records whose context is not signed off are marked open or awaiting in every register: they may still change.",
    "",
  ];
  for (const r of opts.registers) {
    out.push(`registers/${r.file} — ${r.title}, ${r.rows} row${r.rows === 1 ? "" : "s"}`);
    for (const [name] of r.columns) out.push(`  ${name}: ${columnMeanings[name] ?? name}`);
    out.push("");
  }
  for (const [path, what] of opts.otherFiles) out.push(`${path} — ${what}`);
  return `${out.join("\n")}\n`;
}
