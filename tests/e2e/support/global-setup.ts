import { rmSync } from "node:fs";
import net from "node:net";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { ensureBuilt, startStack, type Stack } from "../../../scripts/stack";

let stack: Stack | undefined;

/** A port nothing listens on now, so a browser run never collides with another server on this machine. */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

/**
 * One built, seeded app for all browser tests; each test makes its own records so tests do not collide.
 * E2E_VERBOSE=1 shows the app's own log (quiet otherwise).
 */
export default async function setup(project: TestProject) {
  ensureBuilt();
  const dataDir = path.join(".tmp", `e2e-${process.pid}`);
  rmSync(dataDir, { recursive: true, force: true });
  const port = process.env.E2E_PORT ? Number(process.env.E2E_PORT) : await freePort();
  stack = await startStack({ port, dataDir, quiet: !process.env.E2E_VERBOSE, smtpPort: 0, uploadPort: 0 });
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
