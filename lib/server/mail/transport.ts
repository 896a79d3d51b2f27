import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/env";
import type { MailContent } from "./templates/layout";

let cached: { url: string; transporter: Transporter } | undefined;

function transporter(): Transporter {
  const url = env().SMTP_URL;
  if (!cached || cached.url !== url) {
    // Short timeouts: a missing relay must not hold a sign-off request for minutes.
    cached = {
      url,
      transporter: nodemailer.createTransport(url, {
        connectionTimeout: 10_000,
        greetingTimeout: 10_000,
        socketTimeout: 20_000,
      }),
    };
  }
  return cached.transporter;
}

export type Outgoing = MailContent & { to: string | string[]; replyTo?: string };

/** Sends one message over SMTP (SMTP_URL) from MAIL_FROM; throws when the relay refuses it. */
export async function sendMail(message: Outgoing): Promise<{ messageId: string; accepted: string[] }> {
  const to = Array.isArray(message.to) ? message.to : [message.to];
  if (to.length === 0) throw new Error("sendMail: a message needs at least one recipient");
  const info = await transporter().sendMail({
    from: env().MAIL_FROM,
    to,
    replyTo: message.replyTo,
    subject: message.subject,
    text: message.text,
    html: message.html,
  });
  return { messageId: info.messageId, accepted: (info.accepted ?? []).map(String) };
}

export type Delivery = { sent: number; failed: number; error?: string };

/**
 * Sends one message per recipient (no address is shown to the others) and never throws: the record change
 * that caused the mail has already been committed, so a relay failure is logged and reported, not fatal.
 */
export async function deliver(recipients: string[], build: (to: string) => MailContent): Promise<Delivery> {
  const out: Delivery = { sent: 0, failed: 0 };
  for (const to of [...new Set(recipients.map((r) => r.toLowerCase()))]) {
    try {
      await sendMail({ ...build(to), to });
      out.sent++;
    } catch (err) {
      out.failed++;
      out.error = (err as Error).message;
      console.error(`[loamwork] mail to ${to} failed:`, (err as Error).message);
    }
  }
  return out;
}
