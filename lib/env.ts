import { z } from "zod";

/** Every environment variable Loamwork reads, checked once (style.md: config checked at start). */
const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  /** A real PostgreSQL server; when unset, PGlite is embedded. */
  DATABASE_URL: z.string().url().optional(),
  /** PGlite data folder, or "memory" for an in-memory database (tests). */
  LOAMWORK_DATA_DIR: z.string().default(".data/pglite"),
  /** Where uploaded photos and their derivatives are kept. */
  LOAMWORK_FILES_DIR: z.string().default(".data/files"),
  AUTH_SECRET: z.string().min(16).default("loamwork-development-secret-change-me"),
  AUTH_URL: z.string().url().optional(),
  SMTP_URL: z.string().default("smtp://127.0.0.1:2525"),
  MAIL_FROM: z.string().default("Loamwork <loamwork@localhost>"),
  MAIL_SINK_DIR: z.string().default(".data/mail"),
  /** "1" shows the caught-mail page (/dev/mail) in a production build too (demo, browser tests). */
  LOAMWORK_DEV_MAIL: z.enum(["0", "1"]).default("0"),
  /** "1" marks a demo server (npm run demo, browser tests): the sign-in page lists the demo site's accounts. */
  LOAMWORK_DEMO: z.enum(["0", "1"]).default("0"),
  APP_URL: z.string().url().default("http://localhost:3000"),
  /**
   * How many proxies of your own stand in front of Loamwork, each adding the address it was reached from to
   * X-Forwarded-For. 0 (the default): the header is ignored and the client is the address that connected.
   */
  LOAMWORK_TRUSTED_PROXIES: z.coerce.number().int("Give a whole number of proxies.").min(0).max(10).default(0),
  /**
   * Where distribution-test runs execute: "local" (this process) or "pg-boss" (worker processes); default by database.
   */
  /** The upload service's ingest URL (the local stand-in's, in development and tests); browsers upload there. */
  UPLOADTHING_INGEST_URL: z.string().url().optional(),
  LOAMWORK_RUN_QUEUE: z.enum(["local", "pg-boss"]).optional(),
  /** Seconds a chunk of simulations may take before pg-boss offers it to another worker (its worker presumed lost). */
  LOAMWORK_CHUNK_EXPIRE_SECONDS: z.coerce
    .number()
    .int("Give a whole number of seconds.")
    .min(2)
    .max(86_400)
    .default(300),
});

export type Env = z.infer<typeof schema>;

let cached: Env | undefined;

export function env(): Env {
  if (!cached) {
    const parsed = schema.safeParse(process.env);
    if (!parsed.success) {
      const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
      throw new Error(`Loamwork configuration is invalid:\n${lines.join("\n")}`);
    }
    cached = parsed.data;
  }
  return cached;
}
