import { sql } from "drizzle-orm";
import {
  bigserial,
  boolean,
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
  uniqueIndex,
  uuid,
} from "drizzle-orm/pg-core";

/** Site roles (product.md "Who uses it"). A person can hold a different role on each site. */
export const roleEnum = pgEnum("site_role", ["digger", "specialist", "director"]);
/** Record states (product.md "Record states"). */
export const recordStateEnum = pgEnum("record_state", ["open", "awaiting", "signed_off"]);
export const contextTypeEnum = pgEnum("context_type", ["layer", "fill", "cut", "structure", "deposit"]);
/** Stored once per pair; the reverse reading (below, cut by, filled by) is derived. */
export const relationKindEnum = pgEnum("relation_kind", ["above", "cuts", "fills", "same_as"]);
export const findMethodEnum = pgEnum("find_method", ["plan", "typed", "imported"]);
export const runStatusEnum = pgEnum("run_status", ["queued", "running", "done", "failed", "cancelled"]);

const created = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();
const updated = () => timestamp("updated_at", { withTimezone: true }).notNull().defaultNow();

/** GeoJSON Polygon in site-grid metres: first ring outer, the rest holes. */
export type PolygonJson = { type: "Polygon"; coordinates: [number, number][][] };

export const users = pgTable("users", {
  id: uuid("id").primaryKey().defaultRandom(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  passwordHash: text("password_hash").notNull(),
  /** Put into every session at sign-in; raised by signing out or a password reset, which ends older sessions. */
  sessionVersion: integer("session_version").notNull().default(0),
  createdAt: created(),
});

export const signInFailures = pgTable("sign_in_failures", {
  email: text("email").primaryKey(),
  failures: integer("failures").notNull().default(0),
  lastFailureAt: timestamp("last_failure_at", { withTimezone: true }).notNull().defaultNow(),
});

export const sites = pgTable("sites", {
  id: uuid("id").primaryKey().defaultRandom(),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  gridDescription: text("grid_description").notNull().default(""),
  gridOriginX: doublePrecision("grid_origin_x").notNull().default(0),
  gridOriginY: doublePrecision("grid_origin_y").notNull().default(0),
  /** Optional projected CRS for export, as a proj4 string or EPSG code with its definition. */
  crs: text("crs"),
  /** Next find number to hand out; bumped under a row lock so numbers never repeat or skip. */
  nextFindNumber: integer("next_find_number").notNull().default(1),
  createdAt: created(),
});

export const memberships = pgTable(
  "memberships",
  {
    siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    role: roleEnum("role").notNull(),
    createdAt: created(),
  },
  (t) => [primaryKey({ columns: [t.siteId, t.userId] })],
);

export const invitations = pgTable("invitations", {
  id: uuid("id").primaryKey().defaultRandom(),
  siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
  email: text("email").notNull(),
  role: roleEnum("role").notNull(),
  tokenHash: text("token_hash").notNull().unique(),
  invitedBy: uuid("invited_by").notNull().references(() => users.id),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  acceptedAt: timestamp("accepted_at", { withTimezone: true }),
  createdAt: created(),
});

export const trenches = pgTable(
  "trenches",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
    code: text("code").notNull(),
    name: text("name").notNull().default(""),
    outline: jsonb("outline").$type<PolygonJson>().notNull(),
    /** Deepest recorded depth below the surface in metres, for the deep-trench caution. */
    maxDepth: doublePrecision("max_depth"),
    signedOffAt: timestamp("signed_off_at", { withTimezone: true }),
    signedOffBy: uuid("signed_off_by").references(() => users.id),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [uniqueIndex("trenches_site_code").on(t.siteId, t.code)],
);

export const photos = pgTable("photos", {
  id: uuid("id").primaryKey().defaultRandom(),
  siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
  trenchId: uuid("trench_id").references(() => trenches.id, { onDelete: "set null" }),
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
});

export const contexts = pgTable(
  "contexts",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
    trenchId: uuid("trench_id").notNull().references(() => trenches.id, { onDelete: "restrict" }),
    number: integer("number").notNull(),
    type: contextTypeEnum("type").notNull(),
    colour: text("colour").notNull().default(""),
    compaction: text("compaction").notNull().default(""),
    composition: text("composition").notNull().default(""),
    inclusions: text("inclusions").notNull().default(""),
    description: text("description").notNull().default(""),
    interpretation: text("interpretation").notNull().default(""),
    extent: jsonb("extent").$type<PolygonJson>(),
    state: recordStateEnum("state").notNull().default("open"),
    recordedBy: uuid("recorded_by").references(() => users.id),
    submittedAt: timestamp("submitted_at", { withTimezone: true }),
    submittedBy: uuid("submitted_by").references(() => users.id),
    signedOffAt: timestamp("signed_off_at", { withTimezone: true }),
    signedOffBy: uuid("signed_off_by").references(() => users.id),
    createdAt: created(),
    updatedAt: updated(),
  },
  (t) => [uniqueIndex("contexts_site_number").on(t.siteId, t.number), index("contexts_trench").on(t.trenchId)],
);

export const contextRelations = pgTable(
  "context_relations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
    /** Reads "from <kind> to": 1004 above 1007, 1005 cuts 1004, 1006 fills 1005, 1008 same_as 1009. */
    fromId: uuid("from_id").notNull().references(() => contexts.id, { onDelete: "cascade" }),
    toId: uuid("to_id").notNull().references(() => contexts.id, { onDelete: "cascade" }),
    kind: relationKindEnum("kind").notNull(),
    createdBy: uuid("created_by").references(() => users.id),
    createdAt: created(),
  },
  (t) => [uniqueIndex("context_relations_pair").on(t.fromId, t.toId), index("context_relations_to").on(t.toId)],
);

export const artefactClasses = pgTable(
  "artefact_classes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
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
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
    trenchId: uuid("trench_id").notNull().references(() => trenches.id, { onDelete: "restrict" }),
    contextId: uuid("context_id").notNull().references(() => contexts.id, { onDelete: "restrict" }),
    classId: uuid("class_id").notNull().references(() => artefactClasses.id, { onDelete: "restrict" }),
    number: integer("number").notNull(),
    x: doublePrecision("x").notNull(),
    y: doublePrecision("y").notNull(),
    z: doublePrecision("z"),
    count: integer("count"),
    weightG: doublePrecision("weight_g"),
    description: text("description").notNull().default(""),
    method: findMethodEnum("method").notNull(),
    recordedBy: uuid("recorded_by").references(() => users.id),
    recordedAt: timestamp("recorded_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: updated(),
  },
  (t) => [
    uniqueIndex("finds_site_number").on(t.siteId, t.number),
    index("finds_context").on(t.contextId),
    index("finds_class").on(t.classId),
    index("finds_trench").on(t.trenchId),
  ],
);

/** The column mapping a site uses for its total-station exports, remembered between imports. */
export const importMappings = pgTable("import_mappings", {
  siteId: uuid("site_id").primaryKey().references(() => sites.id, { onDelete: "cascade" }),
  mapping: jsonb("mapping").$type<Record<string, string>>().notNull(),
  updatedAt: updated(),
});

export const analysisRuns = pgTable(
  "analysis_runs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
    trenchId: uuid("trench_id").notNull().references(() => trenches.id, { onDelete: "cascade" }),
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
    at: timestamp("at", { withTimezone: true }).notNull().default(sql`now()`),
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
  id: uuid("id").primaryKey().defaultRandom(),
  userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
  tokenHash: text("token_hash").notNull().unique(),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  usedAt: timestamp("used_at", { withTimezone: true }),
  createdAt: created(),
});
