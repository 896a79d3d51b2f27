/**
 * The server's contract for offline recording (issue 14). Pure data: the server and the browser both import it.
 *
 * CONTRACT (what a device can rely on)
 * 1. Exactly once. Every POST, PATCH and DELETE of the JSON API accepts `Idempotency-Key: "<uuid>"` (quoted
 *    or bare; one fresh UUID per queued operation, kept with it in the outbox). The first answer to a
 *    successful write is stored 30 days per user. A resend with the same key and the same bytes (method,
 *    path with query, body) gets that answer again with `Idempotent-Replayed: true` and writes nothing.
 *    Same key, other bytes → 422 `idempotency-key-reused`. Two sends at once: the second waits for the first
 *    and is replayed. A refusal is not stored: resending the same key later is judged afresh. A key that is
 *    not a UUID → 400 `idempotency-key-invalid`. (lib/server/idempotency.ts)
 * 2. Versions. Finds, contexts and trenches carry `version` (an integer raised by every change, sign-off
 *    included) in every answer. PATCH and DELETE of them accept `If-Match: "<version>"`; when the record has
 *    moved on → 409 `stale`, `details = { current, yourVersion, currentVersion }`; nothing changed. No If-Match
 *    = no check. A locked context answers `locked` before any version check. (lib/server/versions.ts)
 * 3. Refusals. Every error body is `{ error, code, fieldErrors?, details? }`: `error` is the sentence to show,
 *    `code` one of `reasonCodes` below. 401 (`unauthenticated`) means sign in again and resend — never a
 *    conflict.
 * 4. Number blocks (kind "find" | "context"; roles digger and director; a specialist is refused 403):
 *    - POST /api/sites/{siteId}/number-blocks  {kind, deviceId, deviceLabel?} → 201 {id, kind, first, last,
 *      left: number[], deviceId, deviceLabel, createdAt}; the size is the site's `numberBlockSize` (director,
 *      PATCH /api/sites/{siteId}, default 50). The device id may come as the `Loamwork-Device` header instead.
 *    - GET  /api/sites/{siteId}/number-blocks → the caller's open blocks with the numbers left.
 *    - POST /api/sites/{siteId}/number-blocks/{blockId}/release {reason} → the unused numbers become void
 *      (who held them, why).
 *    - POST …/finds may carry `number` (a free number of a block the caller holds); POST …/contexts' `number`
 *      inside someone else's block → 409 `number-reserved`, a number not free in the caller's block →
 *      409 `number-not-held`, a void number → 409 `number-void`. Finds without `number` are numbered by the
 *      server past every reserved block, as before.
 *    - GET /api/sites/{siteId}/number-accounting?kind=find → every number 1..highest as find / sample /
 *      context / reserved (block, device, user) / void (reason, who).
 * 5. Discards. POST /api/sites/{siteId}/discards {idempotencyKey, operation, method, path, reasonCode,
 *    reason, note?} records on the audit trail that the user threw away a refused operation.
 */
/**
 * The reason codes of refusals: every error body the JSON API sends is `{ error, code, fieldErrors?, details? }`,
 * where `error` is the sentence to show and `code` one of these, stable, for a device to decide what it can
 * offer (move the record to an open context, take the server's version, keep its own, discard).
 * Pure data: the server and the browser both import it.
 */
export const reasonCodes = {
  invalid: "The input was refused; fieldErrors names the fields.",
  unauthenticated: "Not signed in (or the session ended): sign in again and resend; never a conflict.",
  forbidden: "The caller's role on this site does not allow it.",
  "not-found": "The record (or the site, to a stranger) does not exist.",
  conflict: "Refused because of the records' state; the message says why.",
  duplicate: "A number or code is already taken on this site.",
  busy: "Someone else changed the same records at the same moment; resend as it is.",
  locked: "The context is submitted for sign-off or signed off (details: LockDetails); nothing of it can change.",
  "trench-locked": "The trench is signed off.",
  stale: "The record changed since the version the edit was made on; details.current is the record now.",
  "outside-trench": "The point lies outside its trench's outline (details.distance in metres).",
  "number-not-held": "The number given is not a free number of a block the caller holds.",
  "number-reserved": "The number lies in a block another user or device holds.",
  "number-void": "The number was given up (void) and is never used again.",
  "numbers-used-up": "The site's sequence has no numbers left.",
  "idempotency-key-invalid": "The Idempotency-Key header is not a UUID.",
  "idempotency-key-reused": "The Idempotency-Key was used before for a different request (422).",
  "too-large": "The request body is over the entry's limit.",
  "rate-limited": "Too many tries; wait and try again.",
  server: "The server failed; nothing was changed. Resend later.",
} as const;

export type ReasonCode = keyof typeof reasonCodes;

/** The code a refusal carries when its thrower named none. */
export function reasonForStatus(status: number): ReasonCode {
  switch (status) {
    case 400:
      return "invalid";
    case 401:
      return "unauthenticated";
    case 403:
      return "forbidden";
    case 404:
      return "not-found";
    case 409:
      return "conflict";
    case 413:
      return "too-large";
    case 422:
      return "invalid";
    case 429:
      return "rate-limited";
    default:
      return "server";
  }
}

/** Request header carrying the idempotency key of a write (a UUID made on the device; quoted or bare). */
export const IDEMPOTENCY_KEY_HEADER = "Idempotency-Key";
/** Answer header set to "true" when the answer is the stored first answer to the same key. */
export const IDEMPOTENT_REPLAYED_HEADER = "Idempotent-Replayed";
/** Request header naming the device (a UUID the device keeps) for number blocks and discards. */
export const DEVICE_ID_HEADER = "Loamwork-Device";
/** How long a key and its first answer are kept, in days. */
export const IDEMPOTENCY_KEY_DAYS = 30;
