"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { startTransition, useEffect } from "react";
import { keyNamesSite, onRecordsChanged, siteOfWrite } from "@/lib/api/record-changes";

/**
 * The one refresh after a write: the site's cached queries are marked stale (those on screen refetch) and
 * the server-rendered parts of the page are read again, so a sign-off panel, a record trail or a count
 * never goes on showing what was true before the write. Client state (forms, the plan's view) is kept.
 */
export function RecordRefresh() {
  const qc = useQueryClient();
  const router = useRouter();
  useEffect(
    () =>
      onRecordsChanged((req) => {
        const siteId = siteOfWrite(req.url);
        void qc.invalidateQueries(siteId ? { predicate: (q) => keyNamesSite(q.queryKey, siteId) } : {});
        startTransition(() => router.refresh());
      }),
    [qc, router],
  );
  return null;
}
