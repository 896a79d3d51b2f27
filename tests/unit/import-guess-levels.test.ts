import { describe, expect, it } from "vitest";
import { guessMapping } from "@/lib/server/import/guess";

describe("guessing the z column of an import", () => {
  it("takes the register's own reduced-level column and the usual level headers", () => {
    expect(guessMapping(["number", "x", "y", "z_rl_m"]).z).toBe("z_rl_m");
    expect(guessMapping(["E", "N", "RL"]).z).toBe("RL");
    expect(guessMapping(["E", "N", "Elevation"]).z).toBe("Elevation");
  });

  it("never takes a depth below a surface for a reduced level", () => {
    expect(guessMapping(["E", "N", "depth"]).z).toBeUndefined();
    expect(guessMapping(["E", "N", "Depth"]).z).toBeUndefined();
  });
});
