import "server-only";
import { sql } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { sites } from "@/db/schema";
import { MAX_FIND_NUMBER } from "@/lib/schemas/find";
import { conflict } from "./errors";

/** The site's own counters of the registers numbered apart from finds. */
const counters = {
  sample: "nextSampleNumber",
  drawing: "nextDrawingNumber",
  photo: "nextPhotoNumber",
} as const;
export type RegisterCounter = keyof typeof counters;

/**
 * The next number of one of a site's registers, inside the caller's transaction. The UPDATE takes the site
 * row's lock, so concurrent recorders queue; a rolled-back transaction gives its number back, so the
 * sequence has no gaps; a deleted record's number is never handed out again. Numbers stop at
 * MAX_FIND_NUMBER like finds.
 */
export async function allocateRegisterNumber(tx: Tx, siteId: string, register: RegisterCounter): Promise<number> {
  const key = counters[register];
  const column = sites[key];
  const [row] = await tx
    .update(sites)
    .set({ [key]: sql`${column} + 1` })
    .where(sql`${sites.id} = ${siteId} and ${column} <= ${MAX_FIND_NUMBER}`)
    .returning({ next: column });
  if (row) return row.next - 1;
  throw conflict(
    `This site's ${register} numbers are used up: they go up to ${MAX_FIND_NUMBER.toLocaleString("en-GB")}.`,
    { left: 0 },
  );
}
