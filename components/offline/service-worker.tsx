"use client";

import { Serwist } from "@serwist/window";
import { useEffect } from "react";
import { SERVICE_WORKER_URL } from "@/lib/offline/cache-names";

/**
 * Registers Loamwork's service worker (production builds only: a development server rebuilds its files all
 * the time) and asks it to keep the page the user has open, and each page they move to, so that page opens
 * again offline. Writes are not its business: they go through the outbox.
 */
export function ServiceWorker() {
  useEffect(() => {
    if (process.env.NODE_ENV !== "production" || !("serviceWorker" in navigator)) return;
    const sw = new Serwist(SERVICE_WORKER_URL, { scope: "/", type: "module" });
    const keep = (url: string | URL | null | undefined) => {
      if (!url || !navigator.onLine) return;
      void sw.messageSW({ type: "CACHE_URLS", payload: { urlsToCache: [new URL(url, location.href).href] } });
    };
    void sw.register().then(async () => {
      await navigator.serviceWorker.ready;
      keep(location.href);
    });
    // Client-side moves load only the server's payload; the page itself is fetched and kept beside it.
    const { pushState, replaceState } = history;
    history.pushState = function (...args: Parameters<History["pushState"]>) {
      pushState.apply(this, args);
      keep(args[2]);
    };
    history.replaceState = function (...args: Parameters<History["replaceState"]>) {
      replaceState.apply(this, args);
      keep(args[2]);
    };
    return () => {
      history.pushState = pushState;
      history.replaceState = replaceState;
    };
  }, []);
  return null;
}
