import { describe, expect, it } from "vitest";
import { fmtP } from "@/components/patterns/words";

describe("p-values as shown on a verdict", () => {
  it("never shows an exact zero: below 1e-12 the tails computed as 1 − cdf carry no precision", () => {
    expect(fmtP(0)).toBe("< 1e-12");
    expect(fmtP(3e-15)).toBe("< 1e-12");
    expect(fmtP(2.5e-7)).toBe("2.5e-7");
    expect(fmtP(0.001)).toBe("0.001");
    expect(fmtP(0.2468)).toBe("0.247");
    expect(fmtP(null)).toBe("—");
  });
});
