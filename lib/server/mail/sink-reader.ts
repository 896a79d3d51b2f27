import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import type { SinkMessage } from "./sink-message";

/**
 * The messages the local SMTP sink has caught, newest first. Read by the tests and the development mail page;
 * never used in production, where mail goes to a real relay and nothing is stored.
 */
export function readSinkMessages(dir: string): SinkMessage[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir)
    .filter((f) => f.endsWith(".json"))
    .sort()
    .reverse()
    .map((f) => JSON.parse(readFileSync(path.join(dir, f), "utf8")) as SinkMessage);
}

/** The messages one address received (envelope recipients, so Bcc counts), newest first. */
export function messagesTo(dir: string, address: string): SinkMessage[] {
  const want = address.toLowerCase();
  return readSinkMessages(dir).filter((m) => m.envelope.to.some((a) => a.toLowerCase() === want));
}
