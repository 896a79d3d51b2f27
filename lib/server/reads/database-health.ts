import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";

/** Whether the database answers a trivial query (the health route's check); never throws. */
export async function databaseReachable(): Promise<boolean> {
  try {
    const db = await getDb();
    await db.execute(sql`select 1`);
    return true;
  } catch {
    return false;
  }
}
