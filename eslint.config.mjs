// Loamwork's lint: TypeScript and React hooks rules, Next's rules, and the layout's import boundaries as errors
// (see style.md, "The shape of the house"). `npm run lint`; tests/unit/lint-boundaries.test.ts checks the
// boundaries on fixture files.
import js from "@eslint/js";
import nextPlugin from "@next/eslint-plugin-next";
import boundaries from "eslint-plugin-boundaries";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import tseslint from "typescript-eslint";

/** The folders the boundaries speak of. A file outside them (auth.ts, scripts/, tests/) is not constrained. */
const elements = [
  { type: "app", pattern: "app", partialMatch: false },
  { type: "components", pattern: "components", partialMatch: false },
  { type: "server", pattern: "lib/server", partialMatch: false },
  { type: "spatial", pattern: "lib/spatial", partialMatch: false },
  { type: "db", pattern: "db", partialMatch: false },
  { type: "shared", pattern: ["lib/api", "lib/schemas"], partialMatch: false },
];

const packages = (...names) => ({ to: { module: { origin: ["external", "core"], source: names } } });
const folders = (...types) => ({ to: { element: { types: types } } });

/** Who may not import what. Every other import is allowed. */
const policies = {
  pagesReachNoDatabase: {
    from: { element: { types: ["app", "components"] } },
    disallow: [folders("db"), packages("drizzle-orm")],
    message: "Pages and components get their data from a read function in lib/server, never from db/ or Drizzle.",
  },
  componentsRunNoServerCode: {
    from: { element: { type: "components" } },
    disallow: { ...folders("server"), dependency: { kind: "value" } },
    message: "Components are client code: they may import types from lib/server, never its code.",
  },
  engineStaysPure: {
    from: { element: { type: "spatial" } },
    disallow: [
      folders("app", "components", "db", "server"),
      packages("react", "react-dom", "next", "node:os", "os", "piscina"),
    ],
    message: "The engine is pure TypeScript: no app, components, db, lib/server, React, Next, node:os or piscina.",
  },
  databaseKnowsNoUseCase: {
    from: { element: { type: "db" } },
    disallow: folders("server"),
    message: "db/ is the schema and the client only: it never imports lib/server.",
  },
  sharedKnowsNoServer: {
    from: { element: { type: "shared" } },
    disallow: [folders("server", "db", "app", "components")],
    message:
      "The API catalogue and the schemas are shared with the browser: they import nothing from lib/server, db/, app/ or components/.",
  },
  useCasesKnowNoPage: {
    from: { element: { type: "server" } },
    disallow: folders("app", "components"),
    message: "Use cases in lib/server never import pages or components.",
  },
};

const dependencies = [
  "error",
  {
    default: "allow",
    checkAllOrigins: true,
    policies: Object.values(policies),
  },
];

export default tseslint.config(
  {
    ignores: [
      ".next/**",
      "dist/**",
      "node_modules/**",
      "drizzle/**",
      ".data/**",
      ".tmp/**",
      "test-results/**",
      "next-env.d.ts",
      // AssemblyScript, not TypeScript: its decorators do not parse.
      "lib/spatial/**/asm/**",
      "tests/reference/out/**",
      "tests/fixtures/lint/**",
    ],
  },
  // A disable comment that disables nothing is an error, so none is left behind after the code it excused changes.
  { linterOptions: { reportUnusedDisableDirectives: "error" } },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ["**/*.{ts,tsx,mjs,js}"],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { "react-hooks": reactHooks, "@next/next": nextPlugin },
    rules: {
      // The two classic hook rules. The React Compiler's rules in the plugin's recommended set (refs,
      // set-state-in-effect, incompatible-library, ...) judge code for a compiler Loamwork does not build with.
      "react-hooks/rules-of-hooks": "error",
      "react-hooks/exhaustive-deps": "error",
      ...nextPlugin.configs.recommended.rules,
      ...nextPlugin.configs["core-web-vitals"].rules,
      // Photos and plan images come from access-checked routes, not from Next's image optimiser.
      "@next/next/no-img-element": "off",
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      // A timer declared before the close() that clears it and started after: const cannot say that.
      "prefer-const": ["error", { ignoreReadBeforeAssign: true }],
      // `cond && act()` and `cond ? a() : b()` as statements are house style.
      "@typescript-eslint/no-unused-expressions": ["error", { allowShortCircuit: true, allowTernary: true }],
    },
  },
  {
    // Prettier wraps code at 120 characters (.prettierrc.json) but leaves comments as written; this holds
    // comments and code to the same width. Strings, template literals, URLs and regular expressions may run on:
    // a message or a pattern is easier to find when it is not cut.
    files: ["**/*.{ts,tsx,mjs,js}"],
    rules: {
      "max-len": [
        "error",
        { code: 120, ignoreStrings: true, ignoreTemplateLiterals: true, ignoreUrls: true, ignoreRegExpLiterals: true },
      ],
    },
  },
  {
    // Tests poke at loose JSON and route modules; `useMailSink` is a test helper, not a React hook.
    files: ["tests/**", "**/*.test.ts", "scripts/**"],
    rules: {
      "@typescript-eslint/no-explicit-any": "off",
      "@typescript-eslint/no-unsafe-function-type": "off",
      "react-hooks/rules-of-hooks": "off",
    },
  },
  {
    files: ["**/*.{ts,tsx}"],
    plugins: { boundaries },
    settings: {
      "boundaries/elements": elements,
      "boundaries/dependency-nodes": ["import", "export", "dynamic-import"],
      "import/resolver": { typescript: { alwaysTryTypes: true, project: "./tsconfig.json" } },
    },
    rules: { "boundaries/dependencies": dependencies },
  },
  {
    // auth.ts sits outside the folders above, so this boundary is a plain restricted import.
    files: ["components/**/*.{ts,tsx}"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["@/auth", "**/auth", "next-auth", "next-auth/*"],
              message:
                "Components sign in and out through the server actions in app/, never through auth.ts or next-auth.",
            },
          ],
        },
      ],
    },
  },
);
