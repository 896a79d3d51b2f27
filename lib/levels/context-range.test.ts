import { describe, expect, it } from "vitest";
import { depthToLevel, levelOutsideContext } from "./context-range";

describe("levelOutsideContext", () => {
  const range = { top: 49.6, base: 49.2 };
  it("says nothing of a level within the range or within the tolerance of it, or of no level", () => {
    expect(levelOutsideContext(49.4, range, 0.005, 1005)).toBeNull();
    expect(levelOutsideContext(49.604, range, 0.005, 1005)).toBeNull();
    expect(levelOutsideContext(49.196, range, 0.005, 1005)).toBeNull();
    expect(levelOutsideContext(null, range, 0.005, 1005)).toBeNull();
    expect(levelOutsideContext(52, undefined, 0.005, 1005)).toBeNull();
    expect(levelOutsideContext(52, { top: null, base: 49.2 }, 0.005, 1005)).toBeNull();
  });
  it("names how far above the top or below the base a level lies", () => {
    expect(levelOutsideContext(49.65, range, 0.005, 1005)).toBe(
      "RL 49.650 lies 50 mm above the recorded top of context 1005 (49.600)",
    );
    expect(levelOutsideContext(49.1, range, 0.005, 1005)).toBe(
      "RL 49.100 lies 100 mm below the recorded base of context 1005 (49.200)",
    );
  });
  it("turns a depth below the surface into a reduced level", () => {
    expect(depthToLevel(50.12, 0.35)).toBe(49.77);
    expect(depthToLevel(50.12, 1.005)).toBe(49.115);
  });
});
