import { ApiError, handleUploads, handleWrites, sendRequest, type ApiRequest } from "@/lib/api/client";
import { userCaches } from "./cache-names";
import { freeNumbers, refreshBlocks, topUpBlocks, type NumberKind } from "./number-blocks";
import { Outbox } from "./outbox";
import type { OutboxEntry } from "./outbox-db";
import { cacheSiteMatrix, deviceLoopCheck } from "./relations";
import { backoffSeconds, syncOutbox } from "./sync";
import { createUploadPath, createWritePath, isNetworkFailure, worksOffline } from "./write-path";

/**
 * The signed-in user's device: their outbox takes every write (lib/api/client.ts `handleWrites`), a sync
 * sends it whenever the server can be reached (with back-off after failures), number blocks are kept
 * topped up for the site in use, and a snapshot of it all feeds the status in the header.
 */
export type Phase = "idle" | "sending" | "waiting-for-server" | "sign-in";
export type DeviceSnapshot = {
  ready: boolean;
  online: boolean;
  phase: Phase;
  waiting: number;
  attention: number;
  entries: OutboxEntry[];
  lastSynced: string | null;
  numbers: Record<NumberKind, number | null>;
  storage: { usage: number; quota: number } | null;
  nextTry: number | null;
};

const empty: DeviceSnapshot = {
  ready: false,
  online: true,
  phase: "idle",
  waiting: 0,
  attention: 0,
  entries: [],
  lastSynced: null,
  numbers: { find: null, context: null },
  storage: null,
  nextTry: null,
};
/** A write waits this long for the server before it is kept in the outbox instead. */
const WRITE_TIMEOUT_MS = 10_000;

class Device {
  private snapshot: DeviceSnapshot = empty;
  private listeners = new Set<() => void>();
  private outbox: Outbox | null = null;
  private siteId: string | null = null;
  private running = false;
  private again = false;
  private failures = 0;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private unreachable = false;
  /** When the site's relations were last read for the loop check (read again at most once a minute). */
  private matrixReadAt = new Map<string, number>();
  /** Called after a sync sent something: screens read the server again. */
  onSynced: () => void = () => {};

  subscribe = (fn: () => void) => {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  };
  getSnapshot = () => this.snapshot;
  getServerSnapshot = () => empty;

  private set(part: Partial<DeviceSnapshot>) {
    this.snapshot = { ...this.snapshot, ...part };
    for (const fn of this.listeners) fn();
  }

  get box(): Outbox | null {
    return this.outbox;
  }

  async start(userId: string, siteId: string | null) {
    this.siteId = siteId;
    if (this.outbox?.userId !== userId) {
      this.outbox = await Outbox.open(userId);
      const box = this.outbox;
      handleWrites(
        createWritePath({
          outbox: box,
          online: () => navigator.onLine && !this.unreachable,
          // A recording write that hangs is kept in the outbox; other writes (imports, fits) take their time.
          send: (req, signal) =>
            worksOffline(req.operation)
              ? sendRequest(
                  req,
                  signal
                    ? AbortSignal.any([signal, AbortSignal.timeout(WRITE_TIMEOUT_MS)])
                    : AbortSignal.timeout(WRITE_TIMEOUT_MS),
                )
              : sendRequest(req, signal),
          queued: () => void this.refresh().then(() => this.kick()),
          loopCheck: (site, relation) => deviceLoopCheck(box, site, relation),
          numberTaken: (site, kind) => void this.numbersFor(site, kind),
        }),
      );
      // Photos taken with no connection are kept, file and all, and uploaded when it returns.
      handleUploads(
        createUploadPath({
          outbox: box,
          online: () => navigator.onLine && !this.unreachable,
          queued: () => void this.refresh().then(() => this.kick()),
        }),
      );
      void navigator.storage?.persist?.();
      this.set({ lastSynced: (await box.fact<string>("lastSynced")) ?? null });
    }
    this.set({ ready: true, online: navigator.onLine });
    await this.refresh();
    this.kick();
  }

  stop() {
    handleWrites(null);
    handleUploads(null);
    this.outbox = null;
    if (this.timer) clearTimeout(this.timer);
    this.snapshot = empty;
  }

  setOnline(online: boolean) {
    this.set({ online });
    if (online) {
      this.unreachable = false;
      this.failures = 0;
      this.kick();
    }
  }

  /** Reads the outbox, the numbers left and the storage estimate into the snapshot. */
  async refresh() {
    const box = this.outbox;
    if (!box) return;
    const entries = await box.all();
    const blocks = await box.blocks();
    const site = this.siteId;
    const numbers = {
      find: site ? freeNumbers(blocks, site, "find") : null,
      context: site ? freeNumbers(blocks, site, "context") : null,
    };
    const est = await navigator.storage?.estimate?.().catch(() => null);
    this.set({
      entries,
      waiting: entries.filter((e) => e.state === "waiting").length,
      attention: entries.filter((e) => e.state === "attention").length,
      numbers,
      storage: est && est.quota ? { usage: est.usage ?? 0, quota: est.quota } : null,
    });
  }

  /** Starts a sync now unless one is running (then it runs again once it ends). */
  kick() {
    if (!this.outbox) return;
    if (this.running) {
      this.again = true;
      return;
    }
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    void this.run();
  }

  private async run() {
    const box = this.outbox;
    if (!box) return;
    this.running = true;
    try {
      do {
        this.again = false;
        await this.online(box);
        if ((this.snapshot.phase as Phase) === "sign-in") break;
        if ((await box.count()).waiting === 0) continue;
        this.set({ phase: "sending" });
        const out = await syncOutbox({ outbox: box, progress: () => void this.refresh() });
        if (out.sent > 0) {
          this.matrixReadAt.clear();
          this.onSynced();
        }
        if (out.stopped === "sign-in") this.set({ phase: "sign-in" });
        else if (out.stopped === "done") await this.synced(box);
        else this.retryLater(out.stopped === "offline");
      } while (this.again && (this.snapshot.phase as Phase) !== "sign-in");
      if ((this.snapshot.phase as Phase) === "sending") this.set({ phase: "idle" });
    } finally {
      this.running = false;
      await this.refresh();
    }
  }

  /** With the server in reach: blocks held and topped up, the site's relations cached for the loop check. */
  private async online(box: Outbox) {
    const site = this.siteId;
    if (!site || !navigator.onLine) return;
    try {
      await refreshBlocks(box, site);
      await this.numbersFor(site, "find");
      await this.numbersFor(site, "context");
      if (Date.now() - (this.matrixReadAt.get(site) ?? 0) > 60_000) {
        await cacheSiteMatrix(box, site);
        this.matrixReadAt.set(site, Date.now());
      }
      this.unreachable = false;
      if ((await box.count()).waiting === 0) await this.synced(box);
    } catch (err) {
      if (err instanceof ApiError && err.status === 401) this.set({ phase: "sign-in" });
      else if (isNetworkFailure(err)) this.retryLater(true);
      // A specialist holds no blocks (403): recording is not theirs, nothing to do. A fault in our own code
      // is not a lost connection: it surfaces (the device stays online, writes still go to the server).
      else if (!(err instanceof ApiError)) throw err;
    }
  }

  private async numbersFor(site: string, kind: NumberKind) {
    const box = this.outbox;
    if (!box || !navigator.onLine || this.unreachable) return this.refresh();
    try {
      await topUpBlocks(box, site, kind);
    } catch (err) {
      if (!(err instanceof ApiError) && !isNetworkFailure(err)) throw err;
    }
    await this.refresh();
  }

  private async synced(box: Outbox) {
    this.failures = 0;
    const now = new Date().toISOString();
    await box.setFact("lastSynced", now);
    this.set({ lastSynced: now, phase: "idle", nextTry: null });
  }

  private retryLater(unreachable: boolean) {
    this.unreachable = unreachable;
    this.failures++;
    const wait = backoffSeconds(this.failures) * 1000;
    this.set({ phase: "waiting-for-server", nextTry: Date.now() + wait });
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => this.kick(), wait);
  }
}

export const device = new Device();

/** Signing out: the pages and data this user opened leave the device; their outbox stays theirs. */
export async function clearUserCaches(): Promise<void> {
  if (typeof caches === "undefined") return;
  await Promise.all(userCaches.map((name) => caches.delete(name)));
}

/** The outbox as a file a person can keep or send by other means. */
export function exportOutbox(entries: OutboxEntry[]): Blob {
  return new Blob([JSON.stringify({ exportedAt: new Date().toISOString(), entries }, null, 2)], {
    type: "application/json",
  });
}

export type { ApiRequest };
