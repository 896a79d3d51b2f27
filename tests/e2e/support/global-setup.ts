import { rmSync } from "node:fs";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { ensureBuilt, startStack, type Stack } from "../../../scripts/stack";

let stack: Stack | undefined;

/** One built, seeded app for all browser tests; each test makes its own records so tests do not collide. */
export default async function setup(project: TestProject) {
  ensureBuilt();
  const dataDir = path.join(".tmp", `e2e-${process.pid}`);
  rmSync(dataDir, { recursive: true, force: true });
  stack = await startStack({ port: Number(process.env.E2E_PORT ?? 3100), dataDir, quiet: true });
  project.provide("baseURL", stack.url);
  project.provide("dataDir", path.resolve(dataDir));
  return async () => {
    await stack?.stop();
  };
}

declare module "vitest" {
  export interface ProvidedContext {
    baseURL: string;
    dataDir: string;
  }
}
