import { describe, expect, it } from "vitest";
import { countOf } from "./count";

describe("counts in words", () => {
  it("puts the noun in the number the count needs", () => {
    expect(countOf(1, "find")).toBe("1 find");
    expect(countOf(0, "find")).toBe("0 finds");
    expect(countOf(447, "find")).toBe("447 finds");
    expect(countOf(1, "e-mail")).toBe("1 e-mail");
    expect(countOf(2, "context sheet")).toBe("2 context sheets");
    expect(countOf(12000, "find")).toBe("12,000 finds");
  });
});
