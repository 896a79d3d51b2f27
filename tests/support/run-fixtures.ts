import { readFileSync } from "node:fs";
import path from "node:path";
import type { DemoSite } from "./demo-site";

/** A run as a former version of Loamwork stored it in analysis_runs, kept in tests/fixtures. */
export type StoredRunFixture<Result = Record<string, unknown>> = {
  scope: Record<string, unknown>;
  method: string;
  params: Record<string, unknown>;
  seed: number;
  engineVersion: string;
  result: Result;
};

/**
 * The runs of a fixture file in tests/fixtures, its {{trench}}, {{class CODE}} and {{context N}}
 * placeholders replaced by the demo site's record ids; a placeholder the site has no record for throws.
 */
export function readRunFixture<Result>(file: string, d: DemoSite): StoredRunFixture<Result>[] {
  const ids: Record<string, string> = { trench: d.trenchId };
  for (const [code, id] of Object.entries(d.cls)) ids[`class ${code}`] = id;
  for (const [n, id] of Object.entries(d.ctx)) ids[`context ${n}`] = id;
  const text = readFileSync(path.join(process.cwd(), "tests/fixtures", file), "utf8").replace(
    /\{\{([^}]+)\}\}/g,
    (_, name: string) => {
      const id = ids[name];
      if (!id) throw new Error(`No demo record for ${name}`);
      return id;
    },
  );
  return (JSON.parse(text) as { runs: StoredRunFixture<Result>[] }).runs;
}
