import { describe, expect, it } from "vitest";
import { formatDay, formatWhen, pickLocale } from "./when";

const at = new Date("2026-12-03T10:19:00Z");

describe("dates in one format per person", () => {
  it("takes the first language of Accept-Language that can be formatted, else en-GB", () => {
    expect(pickLocale("de-DE,de;q=0.9,en;q=0.8")).toBe("de-DE");
    expect(pickLocale("en-US,en;q=0.9")).toBe("en-US");
    expect(pickLocale("*")).toBe("en-GB");
    expect(pickLocale(null)).toBe("en-GB");
    expect(pickLocale("not a tag!!, fr")).toBe("fr");
  });

  it("formats a stamp in that language, in UTC and saying so (expected strings from Node's ICU)", () => {
    expect(formatWhen(at, "en-GB")).toBe("3 Dec 2026, 10:19 UTC");
    expect(formatWhen(at, "en-US")).toBe("Dec 3, 2026, 10:19 AM UTC");
    expect(formatWhen(at.toISOString(), "en-GB")).toBe("3 Dec 2026, 10:19 UTC");
    expect(formatDay(at, "en-GB")).toBe("3 Dec 2026");
  });
});
