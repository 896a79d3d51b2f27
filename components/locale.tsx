"use client";

import { createContext, useCallback, useContext, type ReactNode } from "react";
import { DEFAULT_LOCALE, formatDay, formatWhen } from "@/lib/words/when";

const LocaleContext = createContext(DEFAULT_LOCALE);

/** Hands the person's language, read on the server from their request, to every client component. */
export function LocaleProvider({ locale, children }: { locale: string; children: ReactNode }) {
  return <LocaleContext.Provider value={locale}>{children}</LocaleContext.Provider>;
}

/** Date formatters in the person's one format (lib/words/when.ts), the same as the server's pages use. */
export function useDates() {
  const locale = useContext(LocaleContext);
  const when = useCallback((at: Date | string) => formatWhen(at, locale), [locale]);
  const day = useCallback((at: Date | string) => formatDay(at, locale), [locale]);
  return { when, day };
}
