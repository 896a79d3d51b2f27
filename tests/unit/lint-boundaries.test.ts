import { readFileSync } from "node:fs";
import path from "node:path";
import { ESLint } from "eslint";
import { beforeAll, describe, expect, it } from "vitest";

/**
 * The layout's import boundaries (style.md, "The shape of the house") are ESLint errors. Each fixture in
 * tests/fixtures/lint is linted with the repository's own eslint.config.mjs as if it lived in the folder
 * named below, and the test checks which of its lines break a boundary.
 */
const root = path.resolve(import.meta.dirname, "../..");
const fixtures = path.join(root, "tests/fixtures/lint");

let eslint: ESLint;
beforeAll(() => {
  eslint = new ESLint({ cwd: root });
});

/** Lines of the fixture that the boundary rule refuses, with the rule's message for each. */
async function refusals(fixture: string, lintedAs: string) {
  const code = readFileSync(path.join(fixtures, fixture), "utf8");
  const [result] = await eslint.lintText(code, { filePath: path.join(root, lintedAs) });
  const others = result.messages.filter((m) => m.ruleId !== "boundaries/dependencies");
  expect(others, "the fixture has no other lint problem").toEqual([]);
  return result.messages.map((m) => ({ line: m.line, message: m.message }));
}

const noDatabase = "Pages and components get their data from a read function in lib/server, never from db/ or Drizzle.";
const noServerCode = "Components are client code: they may import types from lib/server, never its code.";
const pureEngine =
  "The engine is pure TypeScript: no app, components, db, lib/server, React, Next, node:os or piscina.";

describe("import boundaries", () => {
  it("refuses db/ and Drizzle in a page, by alias, by relative path and by package subpath", async () => {
    // Three folders deep, as the fixture itself is, so that its relative import names db/ in both places.
    const found = await refusals("page-reads-db.tsx", "app/sites/example/page.tsx");
    expect(found).toEqual([2, 3, 4, 5].map((line) => ({ line, message: noDatabase })));
  });

  it("lets a page read through lib/server and use Next and components", async () => {
    expect(await refusals("page-reads-through-server.tsx", "app/sites/[siteId]/example/page.tsx")).toEqual([]);
  });

  it("refuses even a type from db/ in a component", async () => {
    const found = await refusals("component-imports-db-type.tsx", "components/example/example.tsx");
    expect(found).toEqual([{ line: 2, message: noDatabase }]);
  });

  it("refuses lib/server code in a component but allows its types", async () => {
    const found = await refusals("component-runs-server-code.tsx", "components/example/example.tsx");
    expect(found).toEqual([{ line: 2, message: noServerCode }]);
  });

  it("keeps the engine free of the app, the database, React, Next, node:os and piscina", async () => {
    const found = await refusals("engine-imports-outside.ts", "lib/spatial/example.ts");
    expect(found).toEqual([2, 3, 4, 5, 6, 7].map((line) => ({ line, message: pureEngine })));
  });

  it("refuses lib/server in db/", async () => {
    const found = await refusals("db-imports-server.ts", "db/example.ts");
    expect(found).toEqual([
      { line: 2, message: "db/ is the schema and the client only: it never imports lib/server." },
    ]);
  });

  it("refuses components in lib/server but allows db/", async () => {
    const found = await refusals("server-imports-component.ts", "lib/server/example.ts");
    expect(found).toEqual([{ line: 2, message: "Use cases in lib/server never import pages or components." }]);
  });

  it("refuses lib/server, even a type, in the API catalogue, but allows the shared schemas", async () => {
    const found = await refusals("catalogue-imports-server.ts", "lib/api/catalog/example.ts");
    expect(found).toEqual([
      {
        line: 2,
        message:
          "The API catalogue and the schemas are shared with the browser: they import nothing from lib/server, db/, app/ or components/.",
      },
    ]);
  });

  it("refuses the auth module and next-auth in a component, but allows the session's server action", async () => {
    const code = readFileSync(path.join(fixtures, "component-imports-auth.tsx"), "utf8");
    const [result] = await eslint.lintText(code, { filePath: path.join(root, "components/example/example.tsx") });
    expect(result.messages.map((m) => [m.line, m.ruleId])).toEqual([
      [2, "no-restricted-imports"],
      [3, "no-restricted-imports"],
    ]);
    expect(result.messages[0]?.message).toContain("never through auth.ts or next-auth");
  });

  it("refuses a disable comment that disables nothing", async () => {
    const code = "export const n = 1; // eslint-disable-line no-console\n";
    const [result] = await eslint.lintText(code, { filePath: path.join(root, "lib/example.ts") });
    expect(result.messages.map((m) => [m.line, m.severity, m.message])).toEqual([
      [1, 2, "Unused eslint-disable directive (no problems were reported from 'no-console')."],
    ]);
  });

  it("the same imports pass where no boundary applies (a script)", async () => {
    const code = readFileSync(path.join(fixtures, "engine-imports-outside.ts"), "utf8");
    const [result] = await eslint.lintText(code, { filePath: path.join(root, "scripts/example.ts") });
    expect(result.messages).toEqual([]);
  });
});
