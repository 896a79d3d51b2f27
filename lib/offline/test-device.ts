/**
 * What the device tests in this folder share: made-up ids (no server behind them), an outbox of a user of
 * its own for each test, and a server stand-in that answers each idempotency key once.
 */
import { afterEach, beforeEach } from "vitest";
import type { ApiError, ApiRequest } from "@/lib/api/client";
import type { HeldBlock } from "./outbox-db";
import { Outbox } from "./outbox";
import { closeOutboxDb } from "./outbox-db";

export const siteId = "5f0c6a52-8a7e-4a57-9d3e-0a2b1c3d4e5f";
export const contextId = "0b7d1f7e-1c2a-4e0b-8f9a-6c5d4e3f2a1b";
export const classId = "9c1d2e3f-4a5b-4c6d-8e7f-0a1b2c3d4e5f";
export const trenchId = "1a2b3c4d-5e6f-4a7b-8c9d-0e1f2a3b4c5d";

/** The device's blocks most tests start with: finds 501–550 and contexts 9001–9010. */
export const HELD_BLOCKS: HeldBlock[] = [
  { id: "b1", siteId, kind: "find", first: 501, last: 550, used: [] },
  { id: "b2", siteId, kind: "context", first: 9001, last: 9010, used: [] },
];

/**
 * Before each test, opens the outbox of a new user (`<prefix>-<n>`) holding `blocks` and hands it to `use`;
 * after it, closes that outbox's database.
 */
export function outboxPerTest(
  prefix: string,
  blocks: HeldBlock[],
  use: (outbox: Outbox, userId: string) => void,
): void {
  let n = 0;
  let userId = "";
  beforeEach(async () => {
    userId = `${prefix}-${++n}`;
    const outbox = await Outbox.open(userId);
    for (const block of blocks) await outbox.putBlock(block);
    use(outbox, userId);
  });
  afterEach(() => closeOutboxDb(userId));
}

/**
 * A server stand-in: records what reached it (a refused request too), gives each created record an id, answers a
 * key it has seen with its first answer, and refuses what `refuse` says.
 */
export function standInServer(refuse: (req: ApiRequest) => ApiError | null = () => null) {
  const seen: ApiRequest[] = [];
  const byKey = new Map<string, unknown>();
  return {
    seen,
    send: async (req: ApiRequest) => {
      const key = req.headers["idempotency-key"];
      if (byKey.has(key)) return byKey.get(key);
      seen.push(req);
      const refusal = refuse(req);
      if (refusal) throw refusal;
      const answer = { id: crypto.randomUUID(), ...(req.body ? JSON.parse(req.body) : {}) };
      byKey.set(key, answer);
      return answer;
    },
  };
}
