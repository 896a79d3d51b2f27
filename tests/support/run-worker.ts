/**
 * A run worker process as `npm run worker` starts it (scripts/worker.ts), against the database this test file
 * was given: node itself with tsx as its loader, not tsx's command line, which runs the script in a child
 * process that a kill of the parent would leave behind.
 */
import { spawn, type ChildProcess } from "node:child_process";

export type RunWorker = { proc: ChildProcess; log: string };

/** Starts a worker with the production settings and `env` added; its output collects in `log`. */
export function startRunWorker(env: Record<string, string> = {}): RunWorker {
  const proc = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "scripts/worker.ts"], {
    env: {
      ...process.env,
      NODE_ENV: "production",
      DATABASE_URL: process.env.DATABASE_URL,
      LOAMWORK_DATA_DIR: "unused",
      ...env,
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  const w: RunWorker = { proc, log: "" };
  proc.stdout!.on("data", (b) => (w.log += b));
  proc.stderr!.on("data", (b) => (w.log += b));
  return w;
}

/** Waits until each worker says it is ready; throws with the log of one that exits or stays silent first. */
export async function untilReady(workers: RunWorker[], timeoutMs = 60_000): Promise<void> {
  for (const deadline = Date.now() + timeoutMs; ;) {
    const gone = workers.find((w) => w.proc.exitCode !== null);
    if (gone) throw new Error(`a worker exited:\n${gone.log}`);
    if (workers.every((w) => w.log.includes("run worker ready"))) return;
    if (Date.now() > deadline) throw new Error(`no worker ready:\n${workers.map((w) => w.log).join("\n---\n")}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Ends a worker that is still running (SIGTERM, as a deployment stops it) and waits until it has gone. */
export async function stopRunWorker(w: RunWorker | undefined): Promise<void> {
  if (!w || w.proc.exitCode !== null || w.proc.signalCode !== null) return;
  const gone = new Promise((r) => w.proc.once("exit", r));
  w.proc.kill("SIGTERM");
  await gone;
}
