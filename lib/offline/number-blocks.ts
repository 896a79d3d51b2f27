import type { z } from "zod";
import { sendRequest, type ApiRequest } from "@/lib/api/client";
import type { numberBlockView } from "@/lib/api/catalog/offline";
import type { ApiName } from "@/lib/api/catalog";
import type { Outbox } from "./outbox";
import type { HeldBlock } from "./outbox-db";

/**
 * The device's blocks of numbers (lib/api/offline.ts, point 4): reserved by the server for this device and
 * user while online, written on finds and contexts at once when offline. A new block is fetched when the
 * free numbers fall to half a block; fewer than LOW_NUMBERS left is a warning on screen.
 */
export const LOW_NUMBERS = 10;
export type NumberKind = HeldBlock["kind"];
/** A block as the server lists it (lib/api/catalog/offline.ts `numberBlockView`). */
type ServerBlock = Pick<z.infer<typeof numberBlockView>, "id" | "kind" | "first" | "last" | "free" | "deviceId">;

const DEVICE_KEY = "loamwork-device-id";

/** This device's id, made once and kept (a tablet shared by several diggers is one device). */
export function deviceId(): string {
  let id = localStorage.getItem(DEVICE_KEY);
  if (!id) {
    id = crypto.randomUUID();
    localStorage.setItem(DEVICE_KEY, id);
  }
  return id;
}

const json = { "content-type": "application/json" };
const request = (operation: string, method: string, url: string, body?: unknown): ApiRequest => ({
  operation: operation as ApiName,
  method,
  url,
  headers: body === undefined ? {} : json,
  body: body === undefined ? undefined : JSON.stringify(body),
});

/** The device's copy of a server block: numbers the server no longer lists as free are used. */
function held(siteId: string, b: ServerBlock, usedHere: number[] = []): HeldBlock {
  const left = new Set(b.free);
  const used = new Set(usedHere);
  for (let n = b.first; n <= b.last; n++) if (!left.has(n)) used.add(n);
  return { id: b.id, siteId, kind: b.kind, first: b.first, last: b.last, used: [...used].sort((a, c) => a - c) };
}

export function freeNumbers(blocks: HeldBlock[], siteId: string, kind: NumberKind): number {
  return blocks
    .filter((b) => b.siteId === siteId && b.kind === kind)
    .reduce((sum, b) => sum + (b.last - b.first + 1 - new Set(b.used).size), 0);
}

/**
 * The blocks the server says this user holds on the site for this device, merged with what the device has
 * used. A block the same user holds on another tablet is that tablet's: using it here would write a number twice.
 */
export async function refreshBlocks(
  outbox: Outbox,
  siteId: string,
  send = sendRequest,
  device = deviceId(),
): Promise<void> {
  const all = (await send(request("numberBlocksList", "GET", `/api/sites/${siteId}/number-blocks`))) as ServerBlock[];
  const list = all.filter((b) => b.deviceId === device);
  const mine = new Map((await outbox.blocks()).filter((b) => b.siteId === siteId).map((b) => [b.id, b]));
  for (const b of list) await outbox.putBlock(held(siteId, b, mine.get(b.id)?.used));
  // A block the server no longer lists was released or used up: the device forgets it.
  const open = new Set(list.map((b) => b.id));
  for (const id of mine.keys()) if (!open.has(id)) await outbox.removeBlock(id);
}

/** Reserves another block when the free numbers of a kind are half a block or fewer. */
export async function topUpBlocks(
  outbox: Outbox,
  siteId: string,
  kind: NumberKind,
  send = sendRequest,
): Promise<boolean> {
  const blocks = (await outbox.blocks()).filter((b) => b.siteId === siteId && b.kind === kind);
  const size = blocks.length ? Math.max(...blocks.map((b) => b.last - b.first + 1)) : 0;
  if (blocks.length && freeNumbers(blocks, siteId, kind) > size / 2) return false;
  const b = (await send(
    request("numberBlocksCreate", "POST", `/api/sites/${siteId}/number-blocks`, {
      kind,
      deviceId: deviceId(),
      deviceLabel: navigator.userAgent.slice(0, 80),
    }),
  )) as ServerBlock;
  await outbox.putBlock(held(siteId, b));
  return true;
}

/** Gives a block back: its unused numbers become void on the server, with the reason. */
export async function releaseBlock(
  outbox: Outbox,
  block: HeldBlock,
  reason: string,
  send = sendRequest,
): Promise<void> {
  await send(
    request("numberBlockRelease", "POST", `/api/sites/${block.siteId}/number-blocks/${block.id}/release`, { reason }),
  );
  await outbox.removeBlock(block.id);
}
