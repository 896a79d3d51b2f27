import { rmSync } from "node:fs";
import net from "node:net";
import path from "node:path";
import { startStack, type Stack } from "../../../scripts/stack";

/** A port nothing listens on now. */
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
 * A built, seeded app of the test's own, for tests that stop and start the app server (offline recording):
 * the shared stack of the other browser tests is never stopped under them.
 */
export async function ownStack(name: string): Promise<Stack> {
  const dataDir = path.join(".tmp", `e2e-${name}-${process.pid}`);
  rmSync(dataDir, { recursive: true, force: true });
  return startStack({ port: await freePort(), dataDir, quiet: true, smtpPort: 0, uploadPort: 0 });
}
