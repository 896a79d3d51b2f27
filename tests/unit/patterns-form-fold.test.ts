import { describe, expect, it } from "vitest";
import { describeChoices, differsFromDefaults, initialForm } from "@/components/patterns/form-state";

describe("the folded tests and settings of the Patterns form", () => {
  it("say in one line what the defaults will run", () => {
    expect(describeChoices(initialForm("t1"))).toBe(
      "Besag's L, Clark–Evans; 999 simulations, 5 % level, isotropic edge correction, r up to a quarter of the short side, a new seed.",
    );
  });

  it("name a changed choice, and know it differs from the defaults (so the form unfolds)", () => {
    const f = initialForm("t1");
    expect(differsFromDefaults({ ...f, contextIds: ["c"], classIds: ["k"] })).toBe(false);
    const changed = { ...f, nsim: "99", seed: "2026", pcf: { on: true }, rmax: "2" };
    expect(describeChoices(changed)).toBe(
      "Besag's L, Clark–Evans, pair correlation; 99 simulations, 5 % level, isotropic edge correction, r up to 2 m, seed 2026.",
    );
    expect(differsFromDefaults(changed)).toBe(true);
  });
});
