/**
 * Mail in integration tests. Import this module before anything that sends mail: it points SMTP_URL at a
 * sink on a random port while lib/env.ts has not yet read (and cached) the environment. `useMailSink()`
 * starts that sink for the test file and gives the folder its messages land in (read them with
 * lib/server/mail/sink-reader's messagesTo).
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll } from "vitest";
import { startMailSink, type MailSink } from "@/lib/dev-services/mail-sink";

/** The address links in test mail start with. */
export const TEST_APP_URL = "http://loamwork.example";

const port = 20000 + Math.floor(Math.random() * 20000);
process.env.SMTP_URL = `smtp://127.0.0.1:${port}`;
process.env.APP_URL = TEST_APP_URL;
process.env.MAIL_FROM = "Loamwork test <records@loamwork.example>";

export function useMailSink(): { readonly dir: string } {
  const state = { dir: "" };
  let sink: MailSink | undefined;
  beforeAll(async () => {
    state.dir = mkdtempSync(path.join(tmpdir(), "loamwork-mail-"));
    sink = await startMailSink({ port, dir: state.dir });
  });
  afterAll(async () => {
    await sink?.stop();
    rmSync(state.dir, { recursive: true, force: true });
  });
  return state;
}
