/**
 * The local SMTP sink that stands in for a mail relay in development, the demo and the tests
 * (local-services.md "E-mail"). It speaks plain SMTP (no STARTTLS, any or no login), parses each message with
 * mailparser and stores it as one JSON file in `dir`, where the tests and the development mail page read it.
 */
import { mkdirSync, renameSync, writeFileSync } from "node:fs";
import path from "node:path";
import type { AddressInfo } from "node:net";
import { SMTPServer } from "smtp-server";
import { simpleParser, type AddressObject } from "mailparser";
import type { SinkMessage } from "../server/mail/sink-message";

export type MailSinkOptions = { port: number; dir: string; host?: string };
export type MailSink = { url: string; dir: string; stop: () => Promise<void> };

function addresses(a: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(a) ? a : a ? [a] : [];
  return list.flatMap((o) => o.value.map((v) => v.address ?? "")).filter(Boolean);
}

let seq = 0;

/** Starts the sink; `port: 0` picks a free port (the returned url names it). */
export async function startMailSink({ port, dir, host = "127.0.0.1" }: MailSinkOptions): Promise<MailSink> {
  if (!dir) throw new Error("startMailSink: a folder to store messages in is required");
  mkdirSync(dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    allowInsecureAuth: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    size: 10 * 1024 * 1024,
    onAuth(auth, _session, callback) {
      // A stand-in accepts any login so the app can use the same SMTP_URL shape as production.
      callback(null, { user: auth.username ?? "sink" });
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const receivedAt = new Date();
          const id = `${receivedAt.getTime()}-${process.pid}-${String(++seq).padStart(5, "0")}`;
          const message: SinkMessage = {
            id,
            receivedAt: receivedAt.toISOString(),
            envelope: {
              from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
              to: session.envelope.rcptTo.map((r) => r.address),
            },
            from: addresses(mail.from),
            to: addresses(mail.to),
            subject: mail.subject ?? "",
            text: mail.text ?? "",
            html: typeof mail.html === "string" ? mail.html : "",
            messageId: mail.messageId ?? null,
          };
          // Written whole, then renamed, so a reader never sees half a message.
          const file = path.join(dir, `${id}.json`);
          writeFileSync(`${file}.part`, JSON.stringify(message, null, 2));
          renameSync(`${file}.part`, file);
        })
        .then(
          () => callback(),
          (err: Error) => callback(err),
        );
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const bound = (server.server.address() as AddressInfo).port;
  return {
    url: `smtp://${host}:${bound}`,
    dir,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
