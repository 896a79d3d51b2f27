import { sql } from "drizzle-orm";
import {
  bigint,
  bigserial,
  boolean,
  check,
  date,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  real,
  text,
  timestamp,
  unique,
  uniqueIndex,
  uuid,
  type AnyPgColumn,
} from "drizzle-orm/pg-core";

/** Site roles (product.md "Who uses it"). A person can hold a different role on each site. */
export const roleEnum = pgEnum("site_role", ["digger", "specialist", "director"]);
/** Record states (product.md "Record states"). */
export const recordStateEnum = pgEnum("record_state", ["open", "awaiting", "signed_off"]);
export const contextTypeEnum = pgEnum("context_type", ["layer", "fill", "cut", "structure", "deposit"]);
/** Stored once per pair; the reverse reading (below, cut by, filled by) is derived. */
export const relationKindEnum = pgEnum("relation_kind", ["above", "cuts", "fills", "same_as"]);
export const findMethodEnum = pgEnum("find_method", ["plan", "typed", "imported"]);
/** A site's height reference: a named national datum, or a local site datum (field.md, "Levels"). */
export const datumKindEnum = pgEnum("datum_kind", ["national", "local"]);
/** How a context was dug (the sheet's method field); "sieved" carries a mesh size. */
export const digMethodEnum = pgEnum("dig_method", ["trowel", "mattock", "machine", "sieved"]);
/** What a staff reading in a level book was taken on. */
export const levelTargetEnum = pgEnum("level_target", [
  "benchmark",
  "change_point",
  "find",
  "context_top",
  "context_base",
  "spit_top",
  "spit_base",
  "ground",
  "other",
]);
export const runStatusEnum = pgEnum("run_status", ["queued", "running", "done", "failed", "cancelled"]);
/** The trade's kinds of sample (lib/schemas/sample.ts names each on screen). */
export const sampleTypeEnum = pgEnum("sample_type", [
  "bulk",
  "spot",
  "charcoal",
  "monolith",
  "micromorphology",
  "pollen",
  "luminescence",
  "other",
]);
/** Where a sample stands after it left the ground. */
export const sampleStatusEnum = pgEnum("sample_status", ["taken", "processing", "processed", "sent", "discarded"]);
/** Where a find stands after it left the ground (lib/schemas/processing.ts names each on screen). */
export const findProcessingEnum = pgEnum("find_processing", [
  "lifted",
  "washed",
  "marked",
  "bagged",
  "boxed",
  "sent",
  "returned",
]);

const created = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();
/** A record's id: a random UUID made by the database. */
const idColumn = () => uuid("id").primaryKey().defaultRandom();
const updated = () => timestamp("updated_at", { withTimezone: true }).notNull().defaultNow();

/** GeoJSON Polygon in site-grid metres: first ring outer, the rest holes. */
export type PolygonJson = { type: "Polygon"; coordinates: [number, number][][] };

export const users = pgTable("users", {
  id: idColumn(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  passwordHash: text("password_hash").notNull(),
  /** Put into every session at sign-in; raised by signing out or a password reset, which ends older sessions. */
  sessionVersion: integer("session_version").notNull().default(0),
  createdAt: created(),
});

/** Counters of rate-limiter-flexible's Drizzle store (sign-in tries, lib/server/sign-in-limit.ts), in its own shape. */
export const rateLimits = pgTable("rate_limits", {
  key: text("key").primaryKey(),
  points: integer("points").notNull().default(0),
  expire: timestamp("expire", { withTimezone: true }),
});

export const sites = pgTable("sites", {
  id: idColumn(),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  gridDescription: text("grid_description").notNull().default(""),
  gridOriginX: doublePrecision("grid_origin_x").notNull().default(0),
  gridOriginY: doublePrecision("grid_origin_y").notNull().default(0),
  /** Optional projected CRS for export, as a proj4 string or EPSG code with its definition. */
  crs: text("crs"),
  /** Next find number to hand out; bumped under a row lock so numbers never repeat or skip. */
  nextFindNumber: integer("next_find_number").notNull().default(1),
  /** Every z in Loamwork is a reduced level in metres against this datum. */
  datumKind: datumKindEnum("datum_kind").notNull().default("local"),
  datumName: text("datum_name").notNull().default("Site datum"),
  /** Largest acceptable misclosure of a closed levelling run, metres (common practice: a few millimetres). */
  levelTolerance: doublePrecision("level_tolerance").notNull().default(0.005),
  /**
   * Samples take their numbers from the finds' sequence (true) or from their own (false); fixed once a sample exists.
   */
  samplesShareFindNumbers: boolean("samples_share_find_numbers").notNull().default(false),
  /** Next sample number when samples have their own sequence; bumped under the site row's lock like finds. */
  nextSampleNumber: integer("next_sample_number").notNull().default(1),
  /** Address printed in front of label codes (https://…), so any phone camera opens the record; empty = code only. */
  labelAddress: text("label_address"),

  /**
  /** Next drawing number of the drawing register (its own sequence), bumped under the site row's lock. */
  nextDrawingNumber: integer("next_drawing_number").notNull().default(1),
  /** Next number of the photo register (its own sequence), bumped under the site row's lock. */
  nextPhotoNumber: integer("next_photo_number").notNull().default(1),
  /**
   * Vertical spread (metres, highest minus lowest reduced level) above which the finds of one class in a
   * Patterns scope are cautioned as possibly mixing several surfaces. Default 0.20 m: common practice.
   */
  levelSpreadCaution: doublePrecision("level_spread_caution").notNull().default(0.2),
  /** How many numbers a device reserves at once for offline recording (set by the director). */
  numberBlockSize: integer("number_block_size").notNull().default(50),
  createdAt: created(),
});

/** The site a record belongs to; the record goes with its site. */
const siteRef = () =>
  uuid("site_id")
    .notNull()
    .references(() => sites.id, { onDelete: "cascade" });

export const memberships = pgTable(
  "memberships",
  {
    siteId: siteRef(),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: roleEnum("role").notNull(),
    createdAt: created(),
  },
  (t) => [primaryKey({ columns: [t.siteId, t.userId] })],
);

export const invitations = pgTable("invitations", {
  id: idColumn(),
  siteId: siteRef(),
  email: text("email").notNull(),
  role: roleEnum("role").notNull(),
  tokenHash: text("token_hash").notNull().unique(),
  invitedBy: uuid("invited_by")
    .notNull()
    .references(() => users.id),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  acceptedAt: timestamp("accepted_at", { withTimezone: true }),
  createdAt: created(),
});

export const trenches = pgTable(
  "trenches",
  {
    id: idColumn(),
    siteId: siteRef(),
    code: text("code").notNull(),
    name: text("name").notNull().default(""),
    outline: jsonb("outline").$type<PolygonJson>().notNull(),
    /** Reduced level of the ground surface before digging; the deep-trench caution is measured from it. */
    surfaceLevel: doublePrecision("surface_level"),
    /**
     * The square grid bulk finds are counted in (side in metres, lines through the origin on the site grid); null =
     * none yet.
     */
    squareSize: doublePrecision("square_size"),
    squareOriginX: doublePrecision("square_origin_x"),
    squareOriginY: doublePrecision("square_origin_y"),
    signedOffAt: timestamp("signed_off_at", { withTimezone: true }),
    signedOffBy: uuid("signed_off_by").references(() => users.id),
    /** Raised by every change: an edit made on an older version is refused, never applied over this one. */
    version: integer("version").notNull().default(1),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [uniqueIndex("trenches_site_code").on(t.siteId, t.code)],
);

/** A plan underlay (fitted to the grid) or a record photo of the photo register. */
export const photoKindEnum = pgEnum("photo_kind", ["plan", "record"]);
/** Where a record photo's date came from: the camera's EXIF stamp, or the moment it was uploaded. */
export const photoDateSourceEnum = pgEnum("photo_date_source", ["camera", "upload"]);

/**
 * Photos: plan underlays (`plan`, of a trench, fitted to the grid) and the photo register (`record`, numbered
 * per site without gaps, each of exactly one context, find or trench, locked with it). One table, so the
 * files, their derivatives, the member-only file route and the package treat both alike.
 */
export const photos = pgTable(
  "photos",
  {
    id: idColumn(),
    siteId: siteRef(),
    kind: photoKindEnum("kind").notNull().default("plan"),
    /** A plan photo's trench, or the trench a record photo is of. */
    trenchId: uuid("trench_id").references(() => trenches.id, { onDelete: "set null" }),
    /** The context or find a record photo is of (at most one of context, find, trench is set for a record photo). */
    contextId: uuid("context_id").references(() => contexts.id, { onDelete: "restrict" }),
    findId: uuid("find_id").references(() => finds.id, { onDelete: "restrict" }),
    /** Photo register number, per site without gaps (record photos only). */
    number: integer("number"),
    /** Which way the camera faced, whole degrees clockwise from grid north (0 = N, 90 = E); null = not stated. */
    facing: integer("facing"),
    /** The scale shown in the photo as the photographer names it ("1 m", "2 × 1 m"); "none" when there is none. */
    scale: text("scale").notNull().default(""),
    caption: text("caption").notNull().default(""),
    takenBy: uuid("taken_by").references(() => users.id),
    takenAt: timestamp("taken_at", { withTimezone: true }),
    takenAtSource: photoDateSourceEnum("taken_at_source"),
    /** The idempotency key the device sent with the upload: a replayed upload records nothing twice. */
    clientKey: text("client_key"),
    fileKey: text("file_key").notNull().unique(),
    fileName: text("file_name").notNull(),
    mimeType: text("mime_type").notNull(),
    width: integer("width"),
    height: integer("height"),
    /** Local paths (relative to the file store) of the derivatives sharp made. */
    displayPath: text("display_path"),
    thumbPath: text("thumb_path"),
    /** Control points and the fitted transform (photo pixels → site grid). */
    fit: jsonb("fit").$type<Record<string, unknown>>(),
    uploadedBy: uuid("uploaded_by").references(() => users.id),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [
    uniqueIndex("photos_site_number").on(t.siteId, t.number),
    uniqueIndex("photos_site_client_key").on(t.siteId, t.clientKey),
    index("photos_context").on(t.contextId),
    index("photos_find").on(t.findId),
    check(
      "photos_record_subject",
      sql`${t.kind} = 'plan' or (${t.number} is not null and num_nonnulls(${t.contextId}, ${t.findId}, ${t.trenchId}) = 1)`,
    ),
  ],
);

export const contexts = pgTable(
  "contexts",
  {
    id: idColumn(),
    siteId: siteRef(),
    trenchId: uuid("trench_id")
      .notNull()
      .references(() => trenches.id, { onDelete: "restrict" }),
    number: integer("number").notNull(),
    type: contextTypeEnum("type").notNull(),
    colour: text("colour").notNull().default(""),
    compaction: text("compaction").notNull().default(""),
    composition: text("composition").notNull().default(""),
    inclusions: text("inclusions").notNull().default(""),
    description: text("description").notNull().default(""),
    interpretation: text("interpretation").notNull().default(""),
    extent: jsonb("extent").$type<PolygonJson>(),
    lengthM: doublePrecision("length_m"),
    widthM: doublePrecision("width_m"),
    thicknessM: doublePrecision("thickness_m"),
    excavatedBy: text("excavated_by").notNull().default(""),
    openedOn: date("opened_on"),
    closedOn: date("closed_on"),
    digMethod: digMethodEnum("dig_method"),
    sieveMeshMm: doublePrecision("sieve_mesh_mm"),
    state: recordStateEnum("state").notNull().default("open"),
    recordedBy: uuid("recorded_by").references(() => users.id),
    submittedAt: timestamp("submitted_at", { withTimezone: true }),
    submittedBy: uuid("submitted_by").references(() => users.id),
    signedOffAt: timestamp("signed_off_at", { withTimezone: true }),
    signedOffBy: uuid("signed_off_by").references(() => users.id),
    /** Raised by every change: an edit made on an older version is refused, never applied over this one. */
    version: integer("version").notNull().default(1),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [uniqueIndex("contexts_site_number").on(t.siteId, t.number), index("contexts_trench").on(t.trenchId)],
);

export const contextRelations = pgTable(
  "context_relations",
  {
    id: idColumn(),
    siteId: siteRef(),
    /** Reads "from <kind> to": 1004 above 1007, 1005 cuts 1004, 1006 fills 1005, 1008 same_as 1009. */
    fromId: uuid("from_id")
      .notNull()
      .references(() => contexts.id, { onDelete: "cascade" }),
    toId: uuid("to_id")
      .notNull()
      .references(() => contexts.id, { onDelete: "cascade" }),
    kind: relationKindEnum("kind").notNull(),
    createdBy: uuid("created_by").references(() => users.id),
    createdAt: created(),
  },
  (t) => [uniqueIndex("context_relations_pair").on(t.fromId, t.toId), index("context_relations_to").on(t.toId)],
);

export const artefactClasses = pgTable(
  "artefact_classes",
  {
    id: idColumn(),
    siteId: siteRef(),
    code: text("code").notNull(),
    label: text("label").notNull(),
    material: text("material").notNull().default(""),
    colour: text("colour").notNull(),
    symbol: text("symbol").notNull(),
    humanRemains: boolean("human_remains").notNull().default(false),
    createdAt: created(),
  },
  (t) => [uniqueIndex("artefact_classes_site_code").on(t.siteId, t.code)],
);

export const finds = pgTable(
  "finds",
  {
    id: idColumn(),
    siteId: siteRef(),
    trenchId: uuid("trench_id")
      .notNull()
      .references(() => trenches.id, { onDelete: "restrict" }),
    contextId: uuid("context_id")
      .notNull()
      .references(() => contexts.id, { onDelete: "restrict" }),
    classId: uuid("class_id")
      .notNull()
      .references(() => artefactClasses.id, { onDelete: "restrict" }),
    spitId: uuid("spit_id").references(() => spits.id, { onDelete: "restrict" }),
    number: integer("number").notNull(),
    /** The total station's own point ID for an imported find (its shot label), kept apart from the find number. */
    stationPoint: text("station_point"),
    x: doublePrecision("x").notNull(),
    y: doublePrecision("y").notNull(),
    /** Reduced level in metres against the site's datum; null when no level was taken (never 0). */
    z: doublePrecision("z"),
    count: integer("count"),
    weightG: doublePrecision("weight_g"),
    description: text("description").notNull().default(""),
    method: findMethodEnum("method").notNull(),
    recordedBy: uuid("recorded_by").references(() => users.id),
    recordedAt: timestamp("recorded_at", { withTimezone: true }).notNull().defaultNow(),
    /** Raised by every change: an edit made on an older version is refused, never applied over this one. */
    version: integer("version").notNull().default(1),
    /** After the trench: washed, marked, bagged, boxed, sent to a specialist (named in sentTo), returned. */
    processing: findProcessingEnum("processing").notNull().default("lifted"),
    sentTo: text("sent_to").notNull().default(""),
    boxId: uuid("box_id").references((): AnyPgColumn => boxes.id, { onDelete: "restrict" }),
    /** Where it is kept when not in a box, or where in the store its box is not enough to say. */
    location: text("location").notNull().default(""),
    updatedAt: updated(),
  },
  (t) => [
    uniqueIndex("finds_site_number").on(t.siteId, t.number),
    index("finds_box").on(t.boxId),
    index("finds_context").on(t.contextId),
    index("finds_class").on(t.classId),
    index("finds_trench").on(t.trenchId),
  ],
);

/** The column mapping a site uses for its total-station exports, remembered between imports. */
export const importMappings = pgTable("import_mappings", {
  siteId: uuid("site_id")
    .primaryKey()
    .references(() => sites.id, { onDelete: "cascade" }),
  mapping: jsonb("mapping").$type<Record<string, string>>().notNull(),
  updatedAt: updated(),
});

export const analysisRuns = pgTable(
  "analysis_runs",
  {
    id: idColumn(),
    siteId: siteRef(),
    trenchId: uuid("trench_id")
      .notNull()
      .references(() => trenches.id, { onDelete: "cascade" }),
    scope: jsonb("scope").$type<Record<string, unknown>>().notNull(),
    method: text("method").notNull(),
    params: jsonb("params").$type<Record<string, unknown>>().notNull(),
    seed: integer("seed").notNull(),
    status: runStatusEnum("status").notNull().default("queued"),
    progress: real("progress").notNull().default(0),
    result: jsonb("result").$type<Record<string, unknown>>(),
    error: text("error"),
    engineVersion: text("engine_version").notNull(),
    fingerprint: text("fingerprint").notNull(),
    createdBy: uuid("created_by").references(() => users.id),
    createdAt: created(),
    startedAt: timestamp("started_at", { withTimezone: true }),
    finishedAt: timestamp("finished_at", { withTimezone: true }),
  },
  (t) => [index("analysis_runs_trench").on(t.trenchId)],
);

/** Append-only: a trigger in the migrations refuses UPDATE and DELETE. */
export const auditEntries = pgTable(
  "audit_entries",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    siteId: uuid("site_id").notNull(),
    actorId: uuid("actor_id"),
    action: text("action").notNull(),
    recordType: text("record_type").notNull(),
    recordId: text("record_id").notNull(),
    before: jsonb("before"),
    after: jsonb("after"),
    reason: text("reason"),
    at: timestamp("at", { withTimezone: true })
      .notNull()
      .default(sql`now()`),
  },
  (t) => [index("audit_record").on(t.recordType, t.recordId), index("audit_actor").on(t.actorId)],
);

export type User = typeof users.$inferSelect;
export type Site = typeof sites.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Role = (typeof roleEnum.enumValues)[number];
export type Trench = typeof trenches.$inferSelect;
export type Context = typeof contexts.$inferSelect;
export type ContextRelation = typeof contextRelations.$inferSelect;
export type ArtefactClass = typeof artefactClasses.$inferSelect;
export type Find = typeof finds.$inferSelect;
export type AnalysisRun = typeof analysisRuns.$inferSelect;
export type AuditEntry = typeof auditEntries.$inferSelect;
export type Photo = typeof photos.$inferSelect;

export const passwordResets = pgTable("password_resets", {
  id: idColumn(),
  userId: uuid("user_id")
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  tokenHash: text("token_hash").notNull().unique(),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  usedAt: timestamp("used_at", { withTimezone: true }),
  createdAt: created(),
});

/** Temporary benchmarks: points of known reduced level that levelling runs start from and close on. */
export const benchmarks = pgTable(
  "benchmarks",
  {
    id: idColumn(),
    siteId: siteRef(),
    code: text("code").notNull(),
    description: text("description").notNull(),
    x: doublePrecision("x").notNull(),
    y: doublePrecision("y").notNull(),
    /** Reduced level, metres against the site's datum. */
    level: doublePrecision("level").notNull(),
    createdBy: uuid("created_by").references(() => users.id),
    createdAt: created(),
  },
  (t) => [uniqueIndex("benchmarks_site_code").on(t.siteId, t.code)],
);

/** Spits: horizontal slices of a context, numbered from the top, with their top and base reduced levels. */
export const spits = pgTable(
  "spits",
  {
    id: idColumn(),
    siteId: siteRef(),
    contextId: uuid("context_id")
      .notNull()
      .references(() => contexts.id, { onDelete: "restrict" }),
    number: integer("number").notNull(),
    topLevel: doublePrecision("top_level"),
    baseLevel: doublePrecision("base_level"),
    createdBy: uuid("created_by").references(() => users.id),
    createdAt: created(),
  },
  (t) => [uniqueIndex("spits_context_number").on(t.contextId, t.number)],
);

/** Samples taken from a context (bulk soil for flotation, charcoal for dating, a monolith …), locked with it. */
export const samples = pgTable(
  "samples",
  {
    id: idColumn(),
    siteId: siteRef(),
    trenchId: uuid("trench_id")
      .notNull()
      .references(() => trenches.id, { onDelete: "restrict" }),
    contextId: uuid("context_id")
      .notNull()
      .references(() => contexts.id, { onDelete: "restrict" }),
    spitId: uuid("spit_id").references(() => spits.id, { onDelete: "restrict" }),
    number: integer("number").notNull(),
    type: sampleTypeEnum("type").notNull(),
    /** Where it was taken, site-grid metres; null for a sample not plotted as a point. */
    x: doublePrecision("x"),
    y: doublePrecision("y"),
    /** Reduced level where it was taken, metres against the site's datum. */
    z: doublePrecision("z"),
    volumeL: doublePrecision("volume_l"),
    purpose: text("purpose").notNull().default(""),
    takenBy: uuid("taken_by").references(() => users.id),
    takenOn: date("taken_on").notNull(),
    status: sampleStatusEnum("status").notNull().default("taken"),
    boxId: uuid("box_id").references((): AnyPgColumn => boxes.id, { onDelete: "restrict" }),
    location: text("location").notNull().default(""),
    recordedBy: uuid("recorded_by").references(() => users.id),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [
    uniqueIndex("samples_site_number").on(t.siteId, t.number),
    index("samples_context").on(t.contextId),
    index("samples_box").on(t.boxId),
  ],
);

export type Sample = typeof samples.$inferSelect;

export type LevelBookLine = {
  station: string;
  target: (typeof levelTargetEnum.enumValues)[number];
  targetId: string | null;
  backsight: number | null;
  intermediate: number | null;
  foresight: number | null;
};

/** A levelling run as booked: the lines of the level book and what its reduction gave. */
export const levelRuns = pgTable(
  "level_runs",
  {
    id: idColumn(),
    siteId: siteRef(),
    trenchId: uuid("trench_id").references(() => trenches.id, { onDelete: "set null" }),
    takenOn: date("taken_on").notNull(),
    startBenchmarkId: uuid("start_benchmark_id")
      .notNull()
      .references(() => benchmarks.id, { onDelete: "restrict" }),
    closingBenchmarkId: uuid("closing_benchmark_id").references(() => benchmarks.id, { onDelete: "restrict" }),
    book: jsonb("book").$type<LevelBookLine[]>().notNull(),
    tolerance: doublePrecision("tolerance").notNull(),
    misclosure: doublePrecision("misclosure"),
    withinTolerance: boolean("within_tolerance"),
    recordedBy: uuid("recorded_by").references(() => users.id),
    createdAt: created(),
  },
  (t) => [index("level_runs_site").on(t.siteId)],
);

/** One reduced level from a run, kept for what it was taken on (several spot levels per context top or base). */
export const spotLevels = pgTable(
  "spot_levels",
  {
    id: idColumn(),
    siteId: siteRef(),
    runId: uuid("run_id")
      .notNull()
      .references(() => levelRuns.id, { onDelete: "cascade" }),
    line: integer("line").notNull(),
    target: levelTargetEnum("target").notNull(),
    targetId: uuid("target_id"),
    station: text("station").notNull(),
    level: doublePrecision("level").notNull(),
    /** Taken on a run that closed outside tolerance: shown with a flag, never hidden. */
    flagged: boolean("flagged").notNull().default(false),
  },
  (t) => [index("spot_levels_target").on(t.target, t.targetId), index("spot_levels_run").on(t.runId)],
);

export type Benchmark = typeof benchmarks.$inferSelect;
export type Spit = typeof spits.$inferSelect;
export type LevelRun = typeof levelRuns.$inferSelect;
export type SpotLevel = typeof spotLevels.$inferSelect;

/**
 * One grid square dug in one context (and spit, when the context is dug in spits): the row says the square
 * was excavated there. No row = not excavated, left out of every test. `excavatedArea` is the part of the
 * square dug in this context or spit, m²; null = the whole of the square inside the trench. Squares are
 * named by grid indices (lib/geometry/square-grid.ts) so a redrawn outline clips them again and keeps them.
 */
export const squareSamples = pgTable(
  "square_samples",
  {
    id: idColumn(),
    siteId: siteRef(),
    trenchId: uuid("trench_id")
      .notNull()
      .references(() => trenches.id, { onDelete: "restrict" }),
    contextId: uuid("context_id")
      .notNull()
      .references(() => contexts.id, { onDelete: "restrict" }),
    spitId: uuid("spit_id").references(() => spits.id, { onDelete: "restrict" }),
    col: integer("col").notNull(),
    row: integer("row").notNull(),
    excavatedArea: doublePrecision("excavated_area"),
    recordedBy: uuid("recorded_by").references(() => users.id),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [
    unique("square_samples_unit").on(t.contextId, t.spitId, t.col, t.row).nullsNotDistinct(),
    index("square_samples_trench").on(t.trenchId),
  ],
);

/** Count (and weight) of one artefact class in one square sample; 0 is a count entered on purpose. */
export const squareCounts = pgTable(
  "square_counts",
  {
    sampleId: uuid("sample_id")
      .notNull()
      .references(() => squareSamples.id, { onDelete: "cascade" }),
    classId: uuid("class_id")
      .notNull()
      .references(() => artefactClasses.id, { onDelete: "restrict" }),
    count: integer("count").notNull(),
    weightG: doublePrecision("weight_g"),
  },
  (t) => [primaryKey({ columns: [t.sampleId, t.classId] }), index("square_counts_class").on(t.classId)],
);

export type SquareSample = typeof squareSamples.$inferSelect;
export type SquareCount = typeof squareCounts.$inferSelect;

/**
 * A section of finds drawn on a trench plan (field.md, "Sections of finds"): a line from start to end, the
 * band either side of it whose finds are projected onto its vertical plane, and the vertical exaggeration
 * the figure is drawn at. Every coordinate is on the site grid in metres.
 */
export const findSections = pgTable(
  "find_sections",
  {
    id: idColumn(),
    siteId: siteRef(),
    trenchId: uuid("trench_id")
      .notNull()
      .references(() => trenches.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    startX: doublePrecision("start_x").notNull(),
    startY: doublePrecision("start_y").notNull(),
    endX: doublePrecision("end_x").notNull(),
    endY: doublePrecision("end_y").notNull(),
    halfWidth: doublePrecision("half_width").notNull(),
    exaggeration: doublePrecision("exaggeration").notNull(),
    createdBy: uuid("created_by").references(() => users.id),
    createdAt: created(),
  },
  (t) => [uniqueIndex("find_sections_trench_name").on(t.trenchId, t.name)],
);

export type FindSection = typeof findSections.$inferSelect;

/**
 * Idempotency keys (the IETF draft "The Idempotency-Key HTTP Header Field"): the first answer to a write sent
 * with a key, kept per user so that a replay of the same request gets that answer without writing again.
 */
export const idempotencyKeys = pgTable(
  "idempotency_keys",
  {
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    key: uuid("key").notNull(),
    /** SHA-256 of the method, the path with its query and the body, as sent the first time. */
    fingerprint: text("fingerprint").notNull(),
    method: text("method").notNull(),
    path: text("path").notNull(),
    status: integer("status").notNull(),
    contentType: text("content_type").notNull(),
    body: text("body").notNull(),
    createdAt: created(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.key] }), index("idempotency_keys_created").on(t.createdAt)],
);

/** Which sequence of a site a block of numbers is taken from. */
export const numberKindEnum = pgEnum("number_kind", ["find", "context"]);

/**
 * A block of a site's numbers reserved ahead of time by one user on one device, so that records made
 * offline get their final numbers at once (field.md "Numbers"). Released blocks keep their row; their
 * unused numbers become void (numberVoids).
 */
export const numberBlocks = pgTable(
  "number_blocks",
  {
    id: idColumn(),
    siteId: siteRef(),
    kind: numberKindEnum("kind").notNull(),
    first: integer("first_number").notNull(),
    last: integer("last_number").notNull(),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id),
    deviceId: uuid("device_id").notNull(),
    deviceLabel: text("device_label").notNull().default(""),
    createdAt: created(),
    releasedAt: timestamp("released_at", { withTimezone: true }),
    releasedBy: uuid("released_by").references(() => users.id),
    releaseReason: text("release_reason"),
  },
  (t) => [index("number_blocks_site").on(t.siteId, t.kind, t.first), index("number_blocks_user").on(t.userId)],
);

/** Numbers of a site's sequence that will never be used, with why and who held them: a run first..last. */
export const numberVoids = pgTable(
  "number_voids",
  {
    id: idColumn(),
    siteId: siteRef(),
    kind: numberKindEnum("kind").notNull(),
    first: integer("first_number").notNull(),
    last: integer("last_number").notNull(),
    reason: text("reason").notNull(),
    /** Who held the numbers (a released block's holder, a deleted record's recorder), when known. */
    heldBy: uuid("held_by").references(() => users.id),
    voidedBy: uuid("voided_by").references(() => users.id),
    blockId: uuid("block_id").references(() => numberBlocks.id),
    createdAt: created(),
  },
  (t) => [index("number_voids_site").on(t.siteId, t.kind, t.first)],
);

export type IdempotencyKey = typeof idempotencyKeys.$inferSelect;
export type NumberBlock = typeof numberBlocks.$inferSelect;
export type NumberVoid = typeof numberVoids.$inferSelect;
export type NumberKind = (typeof numberKindEnum.enumValues)[number];

/** Plans and sections drawn on film or paper in the field. */
export const drawingKindEnum = pgEnum("drawing_kind", ["plan", "section"]);

/**
 * The drawing register: each plan or section drawn on film or paper, numbered per site without gaps, with
 * the contexts it shows (all in one trench). Locked with those contexts.
 */
export const drawings = pgTable(
  "drawings",
  {
    id: idColumn(),
    siteId: siteRef(),
    trenchId: uuid("trench_id")
      .notNull()
      .references(() => trenches.id, { onDelete: "restrict" }),
    number: integer("number").notNull(),
    kind: drawingKindEnum("kind").notNull(),
    /** The scale's denominator: 20 is 1:20. */
    scale: integer("scale").notNull(),
    title: text("title").notNull().default(""),
    drawnBy: uuid("drawn_by").references(() => users.id),
    drawnOn: date("drawn_on").notNull(),
    recordedBy: uuid("recorded_by").references(() => users.id),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [uniqueIndex("drawings_site_number").on(t.siteId, t.number), index("drawings_trench").on(t.trenchId)],
);

/** Which contexts a drawing shows. */
export const drawingContexts = pgTable(
  "drawing_contexts",
  {
    drawingId: uuid("drawing_id")
      .notNull()
      .references(() => drawings.id, { onDelete: "cascade" }),
    contextId: uuid("context_id")
      .notNull()
      .references(() => contexts.id, { onDelete: "restrict" }),
  },
  (t) => [primaryKey({ columns: [t.drawingId, t.contextId] }), index("drawing_contexts_context").on(t.contextId)],
);

export type Drawing = typeof drawings.$inferSelect;

/** The finds store's boxes: numbered per site, kept in a store; their contents are the finds and samples in them. */
export const boxes = pgTable(
  "boxes",
  {
    id: idColumn(),
    siteId: siteRef(),
    number: integer("number").notNull(),
    /** The store and the place in it (a building, a room, a bay or shelf). */
    store: text("store").notNull().default(""),
    note: text("note").notNull().default(""),
    createdBy: uuid("created_by").references(() => users.id),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [uniqueIndex("boxes_site_number").on(t.siteId, t.number)],
);

export type Box = typeof boxes.$inferSelect;

export const packageStatusEnum = pgEnum("package_status", ["queued", "running", "done", "failed"]);

/**
 * A deposition package being written, or written, as a job: its progress in files, and once done the
 * zip's place in the file store, its size and its fingerprint (the SHA-256 of its manifest-sha256.txt).
 */
export const depositionPackages = pgTable(
  "deposition_packages",
  {
    id: idColumn(),
    siteId: siteRef(),
    /** null = the whole site. */
    trenchId: uuid("trench_id").references(() => trenches.id, { onDelete: "cascade" }),
    status: packageStatusEnum("status").notNull().default("queued"),
    filesDone: integer("files_done").notNull().default(0),
    filesTotal: integer("files_total").notNull().default(0),
    /** The zip's name as downloaded. */
    fileName: text("file_name"),
    /** Relative to the file store; set once the zip is complete. */
    filePath: text("file_path"),
    bytes: bigint("bytes", { mode: "number" }),
    fingerprint: text("fingerprint"),
    error: text("error"),
    createdBy: uuid("created_by").references(() => users.id),
    createdAt: created(),
    startedAt: timestamp("started_at", { withTimezone: true }),
    finishedAt: timestamp("finished_at", { withTimezone: true }),
    /** When a download of the zip last began or ended, on any server process: pruning spares it for a while. */
    downloadedAt: timestamp("downloaded_at", { withTimezone: true }),
  },
  (t) => [index("deposition_packages_site").on(t.siteId)],
);

export type DepositionPackage = typeof depositionPackages.$inferSelect;
