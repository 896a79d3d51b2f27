/** The register's view lives in the URL so a view can be shared: these keys, nothing else. */
export const registerKeys = [
  "trenchId",
  "contextId",
  "classId",
  "recordedBy",
  "from",
  "to",
  "q",
  "sort",
  "dir",
  "page",
  "pageSize",
] as const;
export type RegisterKey = (typeof registerKeys)[number];
export type RegisterView = Partial<Record<RegisterKey, string>>;

export function readView(params: URLSearchParams): RegisterView {
  const out: RegisterView = {};
  for (const k of registerKeys) {
    const v = params.get(k);
    if (v) out[k] = v;
  }
  return out;
}

/** A query string of the view; `omit` drops keys (paging, for exports). */
export function viewQuery(view: RegisterView, omit: RegisterKey[] = []): string {
  const p = new URLSearchParams();
  for (const k of registerKeys) if (view[k] && !omit.includes(k)) p.set(k, view[k]!);
  return p.toString();
}

/** A changed filter sends the reader back to page 1. */
export function withChange(view: RegisterView, change: RegisterView): RegisterView {
  const next = { ...view, ...change };
  if (!("page" in change)) delete next.page;
  for (const k of registerKeys) if (!next[k]) delete next[k];
  return next;
}
