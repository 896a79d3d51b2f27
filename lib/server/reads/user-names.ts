import "server-only";
import { inArray } from "drizzle-orm";
import type { Db } from "@/db/client";
import { users } from "@/db/schema";

/** The names of the given people, by id (who recorded, submitted or signed off a record). */
export async function userNames(db: Db, ids: (string | null | undefined)[]): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((id): id is string => !!id))];
  if (wanted.length === 0) return new Map();
  const rows = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((u) => [u.id, u.name]));
}
