import "server-only";
import { headers } from "next/headers";
import { pickLocale } from "@/lib/words/when";

/** The language this request's person reads dates in (their browser's Accept-Language). */
export async function requestLocale(): Promise<string> {
  return pickLocale((await headers()).get("accept-language"));
}
