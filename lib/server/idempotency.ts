import "server-only";
import { createHash } from "node:crypto";
import { and, eq, lt } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { idempotencyKeys } from "@/db/schema";
import { IDEMPOTENCY_KEY_DAYS, IDEMPOTENCY_KEY_HEADER, IDEMPOTENT_REPLAYED_HEADER } from "@/lib/api/offline";
import { isUuid } from "@/lib/schemas/common";
import { PublicError } from "./errors";

/**
 * Exactly-once writes with the `Idempotency-Key` header (IETF httpapi draft "The Idempotency-Key HTTP Header
 * Field"), applied by guardedRoute to every POST, PATCH and DELETE — never per route.
 *
 * - The key is a UUID made by the client, sent bare or as a structured-field string (`"…"`); anything else
 *   is 400 `idempotency-key-invalid`. Keys are per user: two users' keys never meet.
 * - The fingerprint is SHA-256 over the method, the path with its query, and the body's bytes.
 * - First request: the write runs and its answer (status, content type, body) is stored with the key — in
 *   the same transaction as the write, so either both commit or neither does.
 * - Replay (same key, same fingerprint): the stored answer, with `Idempotent-Replayed: true`; nothing is
 *   written again. Same key, different fingerprint: 422 `idempotency-key-reused`.
 * - The same key sent twice at once: the second waits on the key's row until the first commits, then gets
 *   the replayed answer (we chose waiting over the draft's optional 409: a device resending after a timeout
 *   gets the real answer instead of an error to retry). Operations that start work outside the database
 *   after their own commit (`idempotency: "claim"` in the catalogue, e.g. starting an analysis run) claim the
 *   key in a transaction of its own first; a second request while that claim is open gets 409.
 * - Only successful answers are stored: a refusal wrote nothing, so the same key may be sent again and is
 *   judged afresh (a context reopened meanwhile accepts it).
 * - Keys are kept IDEMPOTENCY_KEY_DAYS (30) days: an older key is treated as never seen; each user's expired
 *   keys are deleted when they next write with a key, and `purgeExpiredIdempotencyKeys` clears the rest.
 */

export type IdempotentRequest = { userId: string; key: string; method: string; path: string; fingerprint: string };
type Answer = { status: number; contentType: string; body: string };

const PENDING = 0;
const lifetimeMs = IDEMPOTENCY_KEY_DAYS * 24 * 60 * 60 * 1000;
const cutoff = (now = new Date()) => new Date(now.getTime() - lifetimeMs);

/** The request's key, or null when it sends none; a malformed key is refused. */
export function idempotencyKeyOf(req: Request): string | null {
  const raw = req.headers.get(IDEMPOTENCY_KEY_HEADER);
  if (raw === null) return null;
  const value = raw.trim().replace(/^"(.*)"$/, "$1");
  if (!isUuid(value)) {
    throw new PublicError(
      400,
      `The ${IDEMPOTENCY_KEY_HEADER} header must be a UUID (made once per operation on the device).`,
      { [IDEMPOTENCY_KEY_HEADER]: ["Not a UUID."] },
      undefined,
      "idempotency-key-invalid",
    );
  }
  return value.toLowerCase();
}

export function requestFingerprint(method: string, url: string, body: string): string {
  const u = new URL(url);
  return createHash("sha256").update(`${method.toUpperCase()} ${u.pathname}${u.search}\n`).update(body).digest("hex");
}

function replay(row: Answer): Response {
  return new Response(row.body, {
    status: row.status,
    headers: { "content-type": row.contentType, [IDEMPOTENT_REPLAYED_HEADER]: "true" },
  });
}

const reused = () =>
  new PublicError(
    422,
    `This ${IDEMPOTENCY_KEY_HEADER} was already used for a different request (another path or body). Each operation needs its own key; a resend must be byte for byte the same.`,
    undefined,
    undefined,
    "idempotency-key-reused",
  );

/** Turns what a handler returned into the answer to send and to store. */
async function answerOf(data: unknown, successStatus: number): Promise<Answer> {
  if (data instanceof Response) {
    return {
      status: data.status,
      contentType: data.headers.get("content-type") ?? "application/octet-stream",
      body: await data.clone().text(),
    };
  }
  return { status: successStatus, contentType: "application/json", body: JSON.stringify(data ?? null) };
}

/**
 * Takes the key for this request inside `tx`: null when it is new (a pending row now holds it until `tx`
 * ends), else the row already there. On PostgreSQL a concurrent holder's uncommitted row makes the insert
 * wait until that transaction ends.
 */
async function claim(tx: Db | Tx, r: IdempotentRequest) {
  await tx
    .delete(idempotencyKeys)
    .where(and(eq(idempotencyKeys.userId, r.userId), lt(idempotencyKeys.createdAt, cutoff())));
  const inserted = await tx
    .insert(idempotencyKeys)
    .values({
      userId: r.userId,
      key: r.key,
      fingerprint: r.fingerprint,
      method: r.method,
      path: r.path,
      status: PENDING,
      contentType: "",
      body: "",
    })
    .onConflictDoNothing()
    .returning({ key: idempotencyKeys.key });
  if (inserted.length) return null;
  const [row] = await tx
    .select()
    .from(idempotencyKeys)
    .where(and(eq(idempotencyKeys.userId, r.userId), eq(idempotencyKeys.key, r.key)));
  if (!row)
    throw new PublicError(
      409,
      "This operation's key was released at this moment; send it again.",
      undefined,
      undefined,
      "busy",
    );
  if (row.fingerprint !== r.fingerprint) throw reused();
  return row;
}

/**
 * Refuses a key already used for another request before the body is even parsed, so a reused key is
 * reported as such (422) rather than as whatever the other body's fields would draw. The claim checks again.
 */
export async function assertKeyFits(db: Db, r: IdempotentRequest): Promise<void> {
  const [row] = await db
    .select({ fingerprint: idempotencyKeys.fingerprint, createdAt: idempotencyKeys.createdAt })
    .from(idempotencyKeys)
    .where(and(eq(idempotencyKeys.userId, r.userId), eq(idempotencyKeys.key, r.key)));
  if (row && row.createdAt >= cutoff() && row.fingerprint !== r.fingerprint) throw reused();
}

async function store(tx: Db | Tx, r: IdempotentRequest, answer: Answer) {
  await tx
    .update(idempotencyKeys)
    .set({ status: answer.status, contentType: answer.contentType, body: answer.body })
    .where(and(eq(idempotencyKeys.userId, r.userId), eq(idempotencyKeys.key, r.key)));
}

/**
 * Runs a write under its idempotency key. "atomic": the key, the write and the stored answer in one
 * transaction (`write` gets that transaction as its db; its own transactions become savepoints).
 * "claim": the key is claimed and committed first, the write runs on `db`, the answer is stored after.
 */
export async function runIdempotent(
  db: Db,
  r: IdempotentRequest,
  mode: "atomic" | "claim",
  successStatus: number,
  write: (db: Db) => Promise<unknown>,
): Promise<Response> {
  if (mode === "atomic") {
    return db.transaction(async (tx) => {
      const prior = await claim(tx, r);
      if (prior) return replay(prior);
      const data = await write(tx as unknown as Db);
      const answer = await answerOf(data, successStatus);
      await store(tx, r, answer);
      return fresh(data, answer);
    });
  }
  const prior = await db.transaction((tx) => claim(tx, r));
  if (prior) {
    if (prior.status === PENDING)
      throw new PublicError(
        409,
        "This operation is being processed at this moment; send it again shortly for its answer.",
        undefined,
        undefined,
        "busy",
      );
    return replay(prior);
  }
  let data: unknown;
  try {
    data = await write(db);
  } catch (err) {
    await db.delete(idempotencyKeys).where(and(eq(idempotencyKeys.userId, r.userId), eq(idempotencyKeys.key, r.key)));
    throw err;
  }
  const answer = await answerOf(data, successStatus);
  await store(db, r, answer);
  return fresh(data, answer);
}

/** The first answer as the handler made it (a Response keeps its own headers; its body was read from a clone). */
function fresh(data: unknown, answer: Answer): Response {
  if (data instanceof Response) return data;
  return new Response(answer.body, { status: answer.status, headers: { "content-type": answer.contentType } });
}

/** Deletes every key older than the kept period (a maintenance job; claims also purge their user's). */
export async function purgeExpiredIdempotencyKeys(db: Db, now = new Date()): Promise<number> {
  const gone = await db
    .delete(idempotencyKeys)
    .where(lt(idempotencyKeys.createdAt, cutoff(now)))
    .returning({ key: idempotencyKeys.key });
  return gone.length;
}
