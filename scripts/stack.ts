/**
 * Starts Loamwork as a person would meet it: the built app on a port, its own PGlite data folder seeded
 * with the demo site, and the local stand-ins for hosted services. Used by `npm run demo` and the browser
 * tests. The seed runs in a child process that exits before the server opens the same folder, because
 * only one process may open a PGlite folder at a time.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { appendFileSync, existsSync, mkdirSync } from "node:fs";
import path from "node:path";
import { startMailSink } from "../lib/dev-services/mail-sink";
import { FAKE_UPLOADTHING_TOKEN, startUploadFake } from "../lib/dev-services/upload-fake";

/** The app's port; the SMTP sink listens on port + 1525 and the upload fake on port + 210 unless given. */
export type StackOptions = {
  port: number;
  dataDir: string;
  quiet?: boolean;
  extraEnv?: Record<string, string>;
  smtpPort?: number;
  uploadPort?: number;
};
export type Stack = {
  url: string;
  env: NodeJS.ProcessEnv;
  stop: () => Promise<void>;
  /** Stops only the app server (services and data stay), as when the site's network is out of reach. */
  stopApp: () => Promise<void>;
  /** Starts the app server again on the same port and data. */
  startApp: () => Promise<void>;
};

const root = path.resolve(import.meta.dirname, "..");

/**
 * The interface the app listens on: 127.0.0.1 unless LOAMWORK_HOST names another (0.0.0.0 for every
 * interface), so a demo started on a laptop is not open to everyone on the same network by accident.
 */
export function listenHost(source: Record<string, string | undefined> = process.env): string {
  const host = source.LOAMWORK_HOST?.trim();
  if (!host) return "127.0.0.1";
  if (!/^[A-Za-z0-9.:-]+$/.test(host)) throw new Error(`LOAMWORK_HOST must be a host name or address, not "${host}"`);
  return host;
}

/** Builds as `npm run build` does when either half is missing: Next's app, and the compiled jobs in dist/. */
export function ensureBuilt(): void {
  const next = path.join(root, "node_modules/next/dist/bin/next");
  if (!existsSync(path.join(root, ".next", "BUILD_ID"))) {
    const r = spawnSync(process.execPath, [next, "build"], { cwd: root, stdio: "inherit" });
    if (r.status !== 0) throw new Error("next build failed");
  }
  if (!existsSync(path.join(root, "dist", "sim-worker-entry.mjs"))) {
    const r = spawnSync(process.execPath, [path.join(root, "scripts/build-jobs.mjs")], { cwd: root, stdio: "inherit" });
    if (r.status !== 0) throw new Error("compiling the jobs into dist/ failed");
  }
}

async function waitForHealth(url: string, child: ChildProcess, timeoutMs = 60_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`the app exited early with code ${child.exitCode}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`the app did not answer ${url}/api/health within ${timeoutMs} ms`);
}

/** Local stand-ins for the hosted services, speaking their real protocols (local-services.md). */
async function startServices(
  opts: StackOptions,
  dataDir: string,
  url: string,
  env: NodeJS.ProcessEnv,
  stops: (() => Promise<void>)[],
) {
  const mail = await startMailSink({ port: opts.smtpPort ?? opts.port + 1525, dir: path.join(dataDir, "mail") });
  stops.push(() => mail.stop());
  const uploads = await startUploadFake({
    port: opts.uploadPort ?? opts.port + 210,
    dir: path.join(dataDir, "uploads"),
    appUrl: url,
  });
  stops.push(() => uploads.stop());
  Object.assign(env, {
    SMTP_URL: mail.url,
    UPLOADTHING_TOKEN: FAKE_UPLOADTHING_TOKEN,
    UPLOADTHING_INGEST_URL: uploads.url,
    UPLOADTHING_API_URL: uploads.url,
    UPLOADTHING_UFS_HOST: uploads.ufs.ufsHost,
    UPLOADTHING_UFS_APP_ID_LOCATION: uploads.ufs.ufsAppIdLocation,
    UPLOADTHING_IS_DEV: "false",
    UPLOADTHING_CALLBACK_URL: `${url}/api/uploadthing`,
    LOAMWORK_DEV_MAIL: "1",
    LOAMWORK_DEMO: "1",
  });
}

/** Seeds in a child process that exits before the server opens the same PGlite folder. */
function seedDemo(env: NodeJS.ProcessEnv, quiet?: boolean) {
  const seed = spawnSync(
    process.execPath,
    ["--conditions=react-server", "--import", "tsx", path.join(root, "scripts/seed-demo.ts")],
    { cwd: root, env, encoding: "utf8" },
  );
  if (seed.status !== 0) throw new Error(`seeding the demo site failed:\n${seed.stdout}\n${seed.stderr}`);
  if (!quiet) process.stdout.write(seed.stdout);
}

export async function startStack(opts: StackOptions): Promise<Stack> {
  const dataDir = path.resolve(root, opts.dataDir);
  mkdirSync(dataDir, { recursive: true });
  const url = `http://localhost:${opts.port}`;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "production",
    LOAMWORK_DATA_DIR: path.join(dataDir, "pglite"),
    LOAMWORK_FILES_DIR: path.join(dataDir, "files"),
    MAIL_SINK_DIR: path.join(dataDir, "mail"),
    AUTH_URL: url,
    APP_URL: url,
    AUTH_SECRET: process.env.AUTH_SECRET ?? "loamwork-local-stack-secret-0001",
    ...opts.extraEnv,
  };
  delete env.DATABASE_URL;
  const stops: (() => Promise<void>)[] = [];
  const stopAll = async () => {
    for (const stop of stops.splice(0).reverse()) await stop();
  };
  let log = "";
  // The app alone can be stopped and started again on the same data (the offline browser test does it).
  let stopApp: () => Promise<void> = async () => {};
  const startApp = async () => {
    const app = spawn(
      process.execPath,
      [
        path.join(root, "node_modules/next/dist/bin/next"),
        "start",
        "-H",
        listenHost(env),
        "-p",
        String(opts.port),
        "--keepAliveTimeout",
        "65000",
      ],
      {
        cwd: root,
        env,
        stdio: opts.quiet ? ["ignore", "pipe", "pipe"] : "inherit",
      },
    );
    // Quiet runs (browser tests) keep the server's output in <dataDir>/app.log for when a test fails.
    const keep = (d: Buffer) => {
      log = (log + d).slice(-20_000);
      appendFileSync(path.join(dataDir, "app.log"), d);
    };
    app.stdout?.on("data", keep);
    app.stderr?.on("data", keep);
    stopApp = () =>
      new Promise<void>((resolve) => {
        if (app.exitCode !== null || app.signalCode !== null) return resolve();
        app.once("exit", () => resolve());
        app.kill("SIGTERM");
        setTimeout(() => app.kill("SIGKILL"), 5000).unref();
      });
    await waitForHealth(url, app);
  };
  try {
    await startServices(opts, dataDir, url, env, stops);
    seedDemo(env, opts.quiet);
    stops.push(() => stopApp());
    await startApp();
  } catch (err) {
    // Whatever had started (services, the app) is stopped, so a failed start leaves no port taken.
    await stopAll();
    throw new Error(`${(err as Error).message}${log ? `\n--- app log ---\n${log}` : ""}`);
  }
  return {
    url,
    env,
    stop: stopAll,
    stopApp: () => stopApp(),
    startApp,
  };
}
