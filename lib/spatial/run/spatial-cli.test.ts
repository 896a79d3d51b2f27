import { spawnSync } from "node:child_process";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "../geometry/demo-window";

const root = join(__dirname, "..", "..", "..");
const run = (input: string) =>
  spawnSync(process.execPath, ["--import", "tsx", join(root, "scripts", "spatial-cli.ts")], {
    input,
    encoding: "utf8",
    cwd: root,
    timeout: 60_000,
  });

describe("npm run spatial (JSON command line)", () => {
  test("reads a run from stdin and prints the result as JSON", () => {
    const points = Array.from({ length: 30 }, (_, k) => ({ x: 0.5 + (k % 6) * 0.7, y: 0.5 + Math.floor(k / 6) * 0.6 }));
    const out = run(
      JSON.stringify({
        window: DEMO_TRENCH,
        points,
        nsim: 19,
        seed: 3,
        tests: [{ type: "clark-evans", correction: "monte-carlo" }],
      }),
    );
    expect(out.status).toBe(0);
    const res = JSON.parse(out.stdout);
    expect(res.seed).toBe(3);
    expect(res.results[0].type).toBe("clark-evans");
    expect(typeof res.results[0].pValue).toBe("number");
  }, 60_000);

  test("bad input: a JSON error naming the problem and exit code 2", () => {
    const out = run(
      JSON.stringify({
        window: DEMO_TRENCH,
        points: [
          { x: 50, y: 50 },
          { x: 1, y: 1 },
        ],
        tests: [{ type: "l-envelope" }],
      }),
    );
    expect(out.status).toBe(2);
    expect(JSON.parse(out.stdout).error).toEqual({
      kind: "input",
      message: expect.stringMatching(/outside the trench/),
    });
    // a misspelt option is refused with its name, not dropped in favour of the default
    const misspelt = run(
      JSON.stringify({
        window: DEMO_TRENCH,
        points: [
          { x: 1, y: 1 },
          { x: 2, y: 2 },
        ],
        tests: [{ type: "l-envelope", corection: "border" }],
      }),
    );
    expect(misspelt.status).toBe(2);
    expect(JSON.parse(misspelt.stdout).error.message).toMatch(/tests\.0: Unrecognized key: "corection"/);
    const broken = run("{ not json");
    expect(broken.status).toBe(2);
    expect(JSON.parse(broken.stdout).error.message).toMatch(/not valid JSON/);
  }, 60_000);
});
