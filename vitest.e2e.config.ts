import { defineConfig } from "vitest/config";
import path from "node:path";

/** Browser tests: one built app (tests/e2e/support/global-setup.ts), files run one after another. */
export default defineConfig({
  resolve: { alias: { "@": path.resolve(import.meta.dirname) } },
  test: {
    include: ["tests/e2e/**/*.e2e.ts"],
    globalSetup: ["tests/e2e/support/global-setup.ts"],
    setupFiles: ["tests/e2e/support/csp-setup.ts"],
    fileParallelism: false,
    testTimeout: 90_000,
    hookTimeout: 180_000,
  },
});
