import { TEST_APP_URL, useMailSink } from "../support/mail-sink";
import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import "../support/harness";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { messagesTo } from "@/lib/server/mail/sink-reader";
import { checkPassword } from "@/lib/server/passwords";
import { makeAccount } from "../support/fixtures";
import { confirmResetAction, requestResetAction } from "@/app/reset-password/actions";

const mail = useMailSink();

const form = (fields: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  return f;
};

/** The password-reset forms' server actions: the same entry, parsing and messages as the API routes. */
describe("password reset forms", () => {
  it("names the e-mail field when the address is not one, and mails nothing", async () => {
    const state = await requestResetAction({}, form({ email: "not-an-address" }));
    expect(state).toEqual({
      error: "Check the input — email: Enter the e-mail address of your account.",
      fieldErrors: { email: ["Enter the e-mail address of your account."] },
    });
    expect(state.done).toBeUndefined();
  });

  it("refuses two different passwords under the second field and changes nothing; the same twice sets it", async () => {
    const db = await getDb();
    const u = await makeAccount("twice@example.org", "old-password-1", "Twice");
    expect(await requestResetAction({}, form({ email: "twice@example.org" }))).toEqual({ done: true });
    const [m] = messagesTo(mail.dir, "twice@example.org");
    const token = m.text.match(new RegExp(`${TEST_APP_URL}/reset-password/([A-Za-z0-9_-]+)`))![1];

    const differ = await confirmResetAction({}, form({ token, password: "new-password-22", again: "new-password-23" }));
    expect(differ).toEqual({
      error: "The two passwords differ.",
      fieldErrors: { again: ["Type the same password twice."] },
    });
    const [unchanged] = await db.select().from(schema.users).where(eq(schema.users.id, u.id));
    expect(await checkPassword("old-password-1", unchanged.passwordHash)).toBe(true);

    expect(
      await confirmResetAction({}, form({ token, password: "new-password-22", again: "new-password-22" })),
    ).toEqual({ done: true });
    const [after] = await db.select().from(schema.users).where(eq(schema.users.id, u.id));
    expect(await checkPassword("new-password-22", after.passwordHash)).toBe(true);
  });
});
