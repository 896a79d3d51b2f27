import type { ApiRequest } from "@/lib/api/client";
import { openOutboxDb, type HeldBlock, type OutboxDb, type OutboxEntry, type Refusal } from "./outbox-db";

/**
 * The outbox of one user on this device: queued writes in the order they were made, the ids the server
 * gave records made here, the number blocks held, and a few facts (last synced). Every method is one
 * IndexedDB transaction, so a closed tab never leaves half a change.
 */
export class Outbox {
  private constructor(
    readonly userId: string,
    private readonly db: OutboxDb,
  ) {}

  static async open(userId: string): Promise<Outbox> {
    return new Outbox(userId, await openOutboxDb(userId));
  }

  async add(entry: Omit<OutboxEntry, "seq" | "state" | "attempts" | "createdAt">): Promise<OutboxEntry> {
    const full: OutboxEntry = { ...entry, state: "waiting", attempts: 0, createdAt: new Date().toISOString() };
    full.seq = await this.db.add("entries", full);
    return full;
  }

  /** Every entry, oldest first. */
  all(): Promise<OutboxEntry[]> {
    return this.db.getAll("entries");
  }

  async waiting(): Promise<OutboxEntry[]> {
    return (await this.all()).filter((e) => e.state === "waiting");
  }

  async count(): Promise<{ waiting: number; attention: number }> {
    const all = await this.all();
    return {
      waiting: all.filter((e) => e.state === "waiting").length,
      attention: all.filter((e) => e.state === "attention").length,
    };
  }

  get(seq: number): Promise<OutboxEntry | undefined> {
    return this.db.get("entries", seq);
  }

  /** The queued create of a record the device made, by the id it gave the record. */
  async createOf(localId: string): Promise<OutboxEntry | undefined> {
    return (await this.all()).find((e) => e.localId === localId);
  }

  async put(entry: OutboxEntry): Promise<void> {
    await this.db.put("entries", entry);
  }

  async remove(seq: number): Promise<void> {
    await this.db.delete("entries", seq);
  }

  async needsAttention(seq: number, refusal: Refusal): Promise<void> {
    const e = await this.get(seq);
    if (e) await this.put({ ...e, state: "attention", refusal });
  }

  /** Sent: the entry goes, and a create's local id now stands for the server's id. */
  async sent(entry: OutboxEntry, answer: unknown): Promise<void> {
    const tx = this.db.transaction(["entries", "ids"], "readwrite");
    const serverId = answer && typeof answer === "object" ? (answer as { id?: unknown }).id : undefined;
    if (entry.localId && typeof serverId === "string")
      await tx.objectStore("ids").put({ localId: entry.localId, serverId });
    await tx.objectStore("entries").delete(entry.seq!);
    await tx.done;
  }

  async serverIdOf(localId: string): Promise<string | undefined> {
    return (await this.db.get("ids", localId))?.serverId;
  }

  /**
   * The request with every id the device made replaced by the server's, or the local ids still unknown
   * (their create has not reached the server yet).
   */
  async resolveIds(req: Pick<ApiRequest, "url" | "body">): Promise<{ url: string; body?: string; unknown: string[] }> {
    const links = await this.db.getAll("ids");
    const pending = (await this.all()).map((e) => e.localId).filter((id): id is string => Boolean(id));
    let { url, body } = req;
    for (const { localId, serverId } of links) {
      url = url.split(localId).join(serverId);
      body = body?.split(localId).join(serverId);
    }
    const unknown = pending.filter((id) => url.includes(id) || Boolean(body?.includes(id)));
    return { url, body, unknown };
  }

  // Number blocks -----------------------------------------------------------------------------------

  blocks(): Promise<HeldBlock[]> {
    return this.db.getAll("blocks");
  }

  async putBlock(block: HeldBlock): Promise<void> {
    const had = await this.db.get("blocks", block.id);
    await this.db.put("blocks", { ...block, used: had ? [...new Set([...had.used, ...block.used])] : block.used });
  }

  async removeBlock(id: string): Promise<void> {
    await this.db.delete("blocks", id);
  }

  /** Writes the lowest free number of the site's held blocks of this kind on a record, or null when none is left. */
  async takeNumber(siteId: string, kind: HeldBlock["kind"]): Promise<number | null> {
    const tx = this.db.transaction("blocks", "readwrite");
    const held = (await tx.store.getAll())
      .filter((b) => b.siteId === siteId && b.kind === kind)
      .sort((a, b) => a.first - b.first);
    for (const b of held) {
      const used = new Set(b.used);
      for (let n = b.first; n <= b.last; n++) {
        if (used.has(n)) continue;
        await tx.store.put({ ...b, used: [...b.used, n] });
        await tx.done;
        return n;
      }
    }
    await tx.done;
    return null;
  }

  // Facts -------------------------------------------------------------------------------------------

  async fact<T>(key: string): Promise<T | undefined> {
    return (await this.db.get("meta", key))?.value as T | undefined;
  }

  async setFact(key: string, value: unknown): Promise<void> {
    await this.db.put("meta", { key, value });
  }
}
