import "server-only";
import { and, asc, eq, gte, isNull, lte, max } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import {
  contexts,
  finds,
  numberBlocks,
  numberVoids,
  samples,
  sites,
  users,
  type NumberBlock,
  type NumberKind,
} from "@/db/schema";
import { DEVICE_ID_HEADER } from "@/lib/api/offline";
import { isUuid } from "@/lib/schemas/common";
import type { NumberBlockCreate } from "@/lib/schemas/number-blocks";
import { recordAudit } from "./audit";
import { PublicError, badInput, conflict, forbidden, notFound } from "./errors";
import { allocateFindNumbers } from "./find-numbers";
import type { SiteActor } from "./membership";

/**
 * Blocks of a site's find or context numbers reserved ahead of time by one user on one device (field.md,
 * "Numbers"), so that what is recorded with no signal gets its final number at once — the number written on
 * the bag. The server still allocates every number: a find block is taken from the finds' counter, so numbers
 * handed out online afterwards start past it; a context block starts past the highest context number, block
 * or void. A record sent with a number must take a free number of a block its sender holds. A block given
 * back turns its unused numbers void, with who held them and why; a deleted record's number is void too.
 * Every number from 1 to the highest is then a record, reserved, or void (number-accounting.ts).
 */

/** Context numbers go up to this (the context schema's bound). */
const MAX_CONTEXT_NUMBER = 9_999_999;

export type BlockView = {
  id: string;
  kind: NumberKind;
  first: number;
  last: number;
  size: number;
  /** How many numbers of the block are still free. */
  left: number;
  /** The free numbers, lowest first. */
  free: number[];
  userId: string;
  deviceId: string;
  deviceLabel: string;
  createdAt: Date;
  releasedAt: Date | null;
};

const kindWords = (kind: NumberKind) => (kind === "find" ? "find" : "context");

/** Takes the site row's lock: reservations, releases and numbered records of one site queue behind it. */
async function lockSite(tx: Db | Tx, siteId: string) {
  const [site] = await tx.select().from(sites).where(eq(sites.id, siteId)).for("update");
  if (!site) throw notFound("That site");
  return site;
}

/** Numbers of first..last already used: records of the sequence, and void numbers. */
async function usedNumbers(
  tx: Db | Tx,
  siteId: string,
  kind: NumberKind,
  first: number,
  last: number,
): Promise<Set<number>> {
  const used = new Set<number>();
  if (kind === "find") {
    const rows = await tx
      .select({ n: finds.number })
      .from(finds)
      .where(and(eq(finds.siteId, siteId), gte(finds.number, first), lte(finds.number, last)));
    for (const r of rows) used.add(r.n);
    const [site] = await tx.select({ shared: sites.samplesShareFindNumbers }).from(sites).where(eq(sites.id, siteId));
    if (site?.shared) {
      const s = await tx
        .select({ n: samples.number })
        .from(samples)
        .where(and(eq(samples.siteId, siteId), gte(samples.number, first), lte(samples.number, last)));
      for (const r of s) used.add(r.n);
    }
  } else {
    const rows = await tx
      .select({ n: contexts.number })
      .from(contexts)
      .where(and(eq(contexts.siteId, siteId), gte(contexts.number, first), lte(contexts.number, last)));
    for (const r of rows) used.add(r.n);
  }
  const voids = await tx
    .select({ first: numberVoids.first, last: numberVoids.last })
    .from(numberVoids)
    .where(
      and(
        eq(numberVoids.siteId, siteId),
        eq(numberVoids.kind, kind),
        lte(numberVoids.first, last),
        gte(numberVoids.last, first),
      ),
    );
  for (const v of voids) for (let n = Math.max(v.first, first); n <= Math.min(v.last, last); n++) used.add(n);
  return used;
}

async function viewOf(tx: Db | Tx, block: NumberBlock): Promise<BlockView> {
  const used = block.releasedAt ? null : await usedNumbers(tx, block.siteId, block.kind, block.first, block.last);
  const free: number[] = [];
  if (used) for (let n = block.first; n <= block.last; n++) if (!used.has(n)) free.push(n);
  return {
    id: block.id,
    kind: block.kind,
    first: block.first,
    last: block.last,
    size: block.last - block.first + 1,
    left: free.length,
    free,
    userId: block.userId,
    deviceId: block.deviceId,
    deviceLabel: block.deviceLabel,
    createdAt: block.createdAt,
    releasedAt: block.releasedAt,
  };
}

/** The device named by the body or, failing that, the Loamwork-Device header. */
export function deviceOf(req: Request, input: { deviceId?: string }): string {
  const header = req.headers.get(DEVICE_ID_HEADER)?.trim();
  const id = input.deviceId ?? header;
  if (!id)
    throw badInput(
      `Name the device that will hold the numbers: deviceId in the body or the ${DEVICE_ID_HEADER} header (a UUID the device keeps).`,
      { deviceId: ["Required."] },
    );
  if (!isUuid(id)) throw badInput(`The device id must be a UUID.`, { deviceId: ["Not a valid device id."] });
  return id.toLowerCase();
}

async function nextContextBlockStart(tx: Db | Tx, siteId: string): Promise<number> {
  const [c] = await tx
    .select({ n: max(contexts.number) })
    .from(contexts)
    .where(eq(contexts.siteId, siteId));
  const [b] = await tx
    .select({ n: max(numberBlocks.last) })
    .from(numberBlocks)
    .where(and(eq(numberBlocks.siteId, siteId), eq(numberBlocks.kind, "context")));
  const [v] = await tx
    .select({ n: max(numberVoids.last) })
    .from(numberVoids)
    .where(and(eq(numberVoids.siteId, siteId), eq(numberVoids.kind, "context")));
  return Math.max(c?.n ?? 0, b?.n ?? 0, v?.n ?? 0) + 1;
}

/** Reserves a block of the site's numbers (its size is the site's setting) for the caller on one device. */
export async function reserveNumberBlock(
  db: Db,
  actor: SiteActor,
  input: NumberBlockCreate,
  deviceId: string,
): Promise<BlockView> {
  return db.transaction(async (tx) => {
    const site = await lockSite(tx, actor.site.id);
    const size = site.numberBlockSize;
    let first: number;
    if (input.kind === "find") {
      first = await allocateFindNumbers(tx as Tx, site.id, size);
    } else {
      first = await nextContextBlockStart(tx, site.id);
      if (first + size - 1 > MAX_CONTEXT_NUMBER) {
        throw new PublicError(
          409,
          `This site's context numbers are used up: they go up to ${MAX_CONTEXT_NUMBER.toLocaleString("en-GB")}.`,
          undefined,
          undefined,
          "numbers-used-up",
        );
      }
    }
    const [block] = await tx
      .insert(numberBlocks)
      .values({
        siteId: site.id,
        kind: input.kind,
        first,
        last: first + size - 1,
        userId: actor.userId,
        deviceId,
        deviceLabel: input.deviceLabel ?? "",
      })
      .returning();
    await recordAudit(tx, {
      siteId: site.id,
      actorId: actor.userId,
      action: "reserve",
      recordType: "number_block",
      recordId: block!.id,
      after: block,
    });
    return viewOf(tx, block!);
  });
}

/** The caller's blocks not given back, with the numbers each has left. */
export async function listNumberBlocks(db: Db, actor: SiteActor, kind?: NumberKind): Promise<BlockView[]> {
  const where = [
    eq(numberBlocks.siteId, actor.site.id),
    eq(numberBlocks.userId, actor.userId),
    isNull(numberBlocks.releasedAt),
  ];
  if (kind) where.push(eq(numberBlocks.kind, kind));
  const rows = await db
    .select()
    .from(numberBlocks)
    .where(and(...where))
    .orderBy(asc(numberBlocks.kind), asc(numberBlocks.first));
  return Promise.all(rows.map((b) => viewOf(db, b)));
}

/** Runs of consecutive numbers: [3,4,5,9] → [[3,5],[9,9]]. */
export function runsOf(numbers: readonly number[]): [number, number][] {
  const out: [number, number][] = [];
  for (const n of numbers) {
    const last = out[out.length - 1];
    if (last && n === last[1] + 1) last[1] = n;
    else out.push([n, n]);
  }
  return out;
}

/**
 * Gives a block back: its unused numbers become void, recorded with who held them and why. The holder
 * may give back their own blocks; a director may give back anyone's (a lost tablet). A number the device
 * used but has not sent yet is void from now on: its record is refused (`number-void`) when it arrives.
 */
export async function releaseNumberBlock(db: Db, actor: SiteActor, blockId: string, reason: string) {
  return db.transaction(async (tx) => {
    await lockSite(tx, actor.site.id);
    const [block] = await tx
      .select()
      .from(numberBlocks)
      .where(and(eq(numberBlocks.siteId, actor.site.id), eq(numberBlocks.id, blockId)));
    if (!block) throw notFound("That number block");
    if (block.userId !== actor.userId && actor.role !== "director")
      throw forbidden("Only the person holding a block, or a director, can give its numbers back.");
    if (block.releasedAt)
      throw conflict(`${kindWords(block.kind)} numbers ${block.first}–${block.last} were already given back.`);
    const used = await usedNumbers(tx, block.siteId, block.kind, block.first, block.last);
    const free: number[] = [];
    for (let n = block.first; n <= block.last; n++) if (!used.has(n)) free.push(n);
    const runs = runsOf(free);
    if (runs.length) {
      await tx.insert(numberVoids).values(
        runs.map(([first, last]) => ({
          siteId: block.siteId,
          kind: block.kind,
          first,
          last,
          reason: `Block given back: ${reason}`,
          heldBy: block.userId,
          voidedBy: actor.userId,
          blockId: block.id,
        })),
      );
    }
    const [after] = await tx
      .update(numberBlocks)
      .set({ releasedAt: new Date(), releasedBy: actor.userId, releaseReason: reason })
      .where(eq(numberBlocks.id, block.id))
      .returning();
    await recordAudit(tx, {
      siteId: block.siteId,
      actorId: actor.userId,
      action: "release",
      recordType: "number_block",
      recordId: block.id,
      before: block,
      after: { ...after, voided: free.length },
      reason,
    });
    return { block: await viewOf(tx, after!), voided: free.length };
  });
}

async function holderWords(tx: Db | Tx, block: NumberBlock): Promise<string> {
  const [u] = await tx.select({ name: users.name }).from(users).where(eq(users.id, block.userId));
  return `${u?.name ?? "another member"}${block.deviceLabel ? ` on ${block.deviceLabel}` : ""}`;
}

/** The void record covering a number, if any. */
async function voidOf(tx: Db | Tx, siteId: string, kind: NumberKind, number: number) {
  const [v] = await tx
    .select()
    .from(numberVoids)
    .where(
      and(
        eq(numberVoids.siteId, siteId),
        eq(numberVoids.kind, kind),
        lte(numberVoids.first, number),
        gte(numberVoids.last, number),
      ),
    )
    .limit(1);
  return v;
}

async function openBlockOf(tx: Db | Tx, siteId: string, kind: NumberKind, number: number) {
  const [b] = await tx
    .select()
    .from(numberBlocks)
    .where(
      and(
        eq(numberBlocks.siteId, siteId),
        eq(numberBlocks.kind, kind),
        isNull(numberBlocks.releasedAt),
        lte(numberBlocks.first, number),
        gte(numberBlocks.last, number),
      ),
    )
    .limit(1);
  return b;
}

const voidRefusal = (kind: NumberKind, number: number, reason: string) =>
  new PublicError(
    409,
    `${kindWords(kind) === "find" ? "Find" : "Context"} number ${number} is void (${reason}) and is never used again; record it without a number to get the next one.`,
    { number: ["That number is void."] },
    { number },
    "number-void",
  );

/**
 * A find sent with its own number (recorded offline from a block): the number must be a free number of a
 * block the caller holds. Called inside the creating transaction; takes the site row's lock.
 */
export async function assertFindNumberHeld(tx: Db | Tx, actor: SiteActor, number: number): Promise<void> {
  await lockSite(tx, actor.site.id);
  const block = await openBlockOf(tx, actor.site.id, "find", number);
  if (!block) {
    const v = await voidOf(tx, actor.site.id, "find", number);
    if (v) throw voidRefusal("find", number, v.reason);
    throw new PublicError(
      409,
      `Find number ${number} is not in a block of numbers you hold; record the find without a number and the server gives it the next one.`,
      { number: ["Not a number you hold."] },
      { number },
      "number-not-held",
    );
  }
  if (block.userId !== actor.userId) {
    throw new PublicError(
      409,
      `Find number ${number} is reserved for ${await holderWords(tx, block)}; only they can use it.`,
      { number: ["Reserved for someone else."] },
      { number, blockId: block.id },
      "number-reserved",
    );
  }
  const used = await usedNumbers(tx, actor.site.id, "find", number, number);
  if (used.has(number)) {
    const v = await voidOf(tx, actor.site.id, "find", number);
    if (v) throw voidRefusal("find", number, v.reason);
    throw new PublicError(
      409,
      `Find number ${number} of your block is already used by another find.`,
      { number: ["Already used."] },
      { number, blockId: block.id },
      "number-not-held",
    );
  }
}

/**
 * A context number typed or sent from a device: refused inside another member's open block, or when void.
 * Numbers of the caller's own blocks, and numbers outside every block, are free as before.
 */
export async function assertContextNumberAllowed(tx: Db | Tx, actor: SiteActor, number: number): Promise<void> {
  await lockSite(tx, actor.site.id);
  const block = await openBlockOf(tx, actor.site.id, "context", number);
  if (block && block.userId !== actor.userId) {
    throw new PublicError(
      409,
      `Context number ${number} is reserved for ${await holderWords(tx, block)}; choose another number.`,
      { number: ["Reserved for someone else."] },
      { number, blockId: block.id },
      "number-reserved",
    );
  }
  const v = await voidOf(tx, actor.site.id, "context", number);
  if (v) throw voidRefusal("context", number, v.reason);
}

/** A deleted record's number: void, with who recorded it and who deleted it. */
export async function voidDeletedNumber(
  tx: Db | Tx,
  siteId: string,
  kind: NumberKind,
  number: number,
  heldBy: string | null,
  voidedBy: string,
  reason: string,
): Promise<void> {
  await tx.insert(numberVoids).values({ siteId, kind, first: number, last: number, reason, heldBy, voidedBy });
}
