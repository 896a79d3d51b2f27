import { mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import nodemailer from "nodemailer";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startMailSink, type MailSink } from "@/lib/dev-services/mail-sink";
import { messagesTo, readSinkMessages } from "@/lib/server/mail/sink-reader";

let sink: MailSink;
let dir: string;
beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "loamwork-sink-"));
  sink = await startMailSink({ port: 0, dir });
});
afterAll(async () => {
  await sink?.stop();
  rmSync(dir, { recursive: true, force: true });
});

describe("the local SMTP sink", () => {
  it("takes mail from nodemailer with or without a login and stores each message whole, Bcc included", async () => {
    expect(sink.url).toMatch(/^smtp:\/\/127\.0\.0\.1:\d+$/);
    const withLogin = nodemailer.createTransport(sink.url.replace("smtp://", "smtp://user:secret@"));
    await withLogin.sendMail({
      from: "Loamwork <a@loamwork.example>",
      to: "One <one@example.org>",
      bcc: "hidden@example.org",
      subject: "Plan 1 – ü",
      text: "plain body",
      html: "<p>html <b>body</b></p>",
    });
    await nodemailer
      .createTransport(sink.url)
      .sendMail({ from: "a@loamwork.example", to: "two@example.org", subject: "Second", text: "two" });

    const all = readSinkMessages(dir);
    expect(all.map((m) => m.subject)).toEqual(["Second", "Plan 1 – ü"]);
    const first = all[1];
    expect(first.from).toEqual(["a@loamwork.example"]);
    expect(first.to).toEqual(["one@example.org"]);
    expect(first.envelope.to.sort()).toEqual(["hidden@example.org", "one@example.org"]);
    expect(first.text.trim()).toBe("plain body");
    expect(first.html).toContain("<b>body</b>");
    expect(messagesTo(dir, "HIDDEN@example.org")).toHaveLength(1);
    expect(readdirSync(dir).filter((f) => !f.endsWith(".json"))).toEqual([]);
  });

  it("refuses to start without a folder", async () => {
    await expect(startMailSink({ port: 0, dir: "" })).rejects.toThrow(/folder/);
  });
});
