"use client";

import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";
import { z } from "zod";
import { LocaleProvider } from "./locale";
import { RecordRefresh } from "./record-refresh";
import { ServiceWorker } from "./offline/service-worker";

// In the browser zod would probe `new Function` to speed up parsing; the page's Content-Security-Policy has
// no 'unsafe-eval', and the caught probe is still reported as a violation. Parse without it.
z.config({ jitless: true });

export function Providers({ children, locale }: { children: ReactNode; locale: string }) {
  const [client] = useState(() => new QueryClient({ defaultOptions: { queries: { staleTime: 10_000, retry: 1 } } }));
  return (
    <QueryClientProvider client={client}>
      <RecordRefresh />
      <ServiceWorker />
      <LocaleProvider locale={locale}>{children}</LocaleProvider>
    </QueryClientProvider>
  );
}
