import type { QueryKey } from "@tanstack/react-query";
import type { ApiRequest } from "./client";

/**
 * Every write the browser makes is announced here once it has succeeded (lib/api/client.ts), so every
 * panel that summarises a record — a react-query list or a part of a server-rendered page — refreshes
 * through one mechanism (components/record-refresh.tsx) rather than each panel remembering to.
 */
type Listener = (req: ApiRequest) => void;
const listeners = new Set<Listener>();

/** Calls `listener` after each successful write; returns the function that stops it. */
export function onRecordsChanged(listener: Listener): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** Tells every listener that `req` changed records on the server. */
export function announceWrite(req: ApiRequest): void {
  for (const listener of listeners) listener(req);
}

/** The site whose records a write changed, read from its path (/api/sites/{siteId}/…), or null. */
export function siteOfWrite(url: string): string | null {
  const m = /^\/api\/sites\/([0-9a-f-]{36})(?:[/?]|$)/i.exec(url);
  return m ? m[1] : null;
}

/**
 * Whether a query summarises records of the site. A record of one site can appear in any summary of
 * that site (a relation changes the sheet's sign-off readiness and the matrix; a find changes its
 * context's counts), so a write makes every query keyed by the site stale; queries of other sites stay.
 */
export function keyNamesSite(key: QueryKey, siteId: string): boolean {
  return key.some((part) => part === siteId);
}
