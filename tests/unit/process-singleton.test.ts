/** One object per process even when the module asking for it is evaluated again (as Next's entries do). */
import { describe, expect, it, vi } from "vitest";

describe("processSingleton", () => {
  it("makes the object once and hands the same one to a fresh evaluation of the module", async () => {
    const make = vi.fn(() => ({ made: Math.random() }));
    const first = (await import("@/lib/process-singleton")).processSingleton("test-slot", make);
    vi.resetModules();
    const again = await import("@/lib/process-singleton");
    expect(again.processSingleton("test-slot", make)).toBe(first);
    expect(make).toHaveBeenCalledTimes(1);
    expect(again.processSingleton("other-slot", () => ({ made: 0 }))).not.toBe(first);
  });
});
