/**
 * Dates and times as a person reads them: one format per person, in the language their browser asks for
 * (Accept-Language on the server, the same tag handed to the browser's components), always in UTC and
 * saying so, so a stamp reads the same on every screen, in every list and in every message.
 */
export const DEFAULT_LOCALE = "en-GB";

/** The first language of an Accept-Language header that this runtime can format dates in. */
export function pickLocale(acceptLanguage: string | null | undefined): string {
  for (const part of (acceptLanguage ?? "").split(",")) {
    const tag = part.split(";")[0]?.trim();
    if (!tag || tag === "*") continue;
    try {
      const [ok] = Intl.DateTimeFormat.supportedLocalesOf(tag);
      if (ok) return ok;
    } catch {
      // not a language tag
    }
  }
  return DEFAULT_LOCALE;
}

const asDate = (at: Date | string) => (typeof at === "string" ? new Date(at) : at);

/** "3 Dec 2026, 10:19 UTC" (en-GB), "Dec 3, 2026, 10:19 AM UTC" (en-US), "3. Dez. 2026, 10:19 UTC" (de). */
export function formatWhen(at: Date | string, locale = DEFAULT_LOCALE): string {
  return `${new Intl.DateTimeFormat(locale, { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" }).format(asDate(at))} UTC`;
}

/** The day alone, in the same person's format: "3 Dec 2026". */
export function formatDay(at: Date | string, locale = DEFAULT_LOCALE): string {
  return new Intl.DateTimeFormat(locale, { dateStyle: "medium", timeZone: "UTC" }).format(asDate(at));
}
