import { TEST_APP_URL, useMailSink } from "../support/mail-sink";
import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeAccount, makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { messagesTo } from "@/lib/server/mail/sink-reader";
import { checkPassword } from "@/lib/server/passwords";
import * as invitationsRoute from "@/app/api/sites/[siteId]/invitations/route";
import * as membersRoute from "@/app/api/sites/[siteId]/members/route";
import { api, type ApiOperation } from "@/lib/server/api-catalog";
import { buildOpenApiDocument } from "@/lib/server/openapi";
import * as acceptRoute from "@/app/api/auth-extra/invitations/accept/route";
import * as resetRequestRoute from "@/app/api/auth-extra/password-reset/request/route";
import * as resetConfirmRoute from "@/app/api/auth-extra/password-reset/confirm/route";

const mail = useMailSink();
const APP = TEST_APP_URL;

/** The single-use token at the end of the first link of that path in a message. */
function tokenIn(text: string, route: string): string {
  const m = text.match(new RegExp(`${APP}/${route}/([A-Za-z0-9_-]+)`));
  if (!m) throw new Error(`no ${route} link in:\n${text}`);
  return m[1];
}

describe("invitations by e-mail", () => {
  it("mails an expiring link; a new person accepts once and joins in the invited role", async () => {
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    const res = await call(
      invitationsRoute,
      "POST",
      { siteId: fx.site.id },
      { email: "New.Digger@Example.org", role: "specialist" },
    );
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    expect(res.json.mail).toEqual({ sent: 1, failed: 0 });
    expect(res.json.invitation.tokenHash).toBeUndefined();
    const [m] = messagesTo(mail.dir, "new.digger@example.org");
    expect(m.from).toEqual(["records@loamwork.example"]);
    expect(m.subject).toBe(`Invitation to ${fx.site.code} ${fx.site.name} on Loamwork`);
    const token = tokenIn(m.text, "invite");
    expect(m.html).toContain(`href="${APP}/invite/${token}"`);
    const days = (new Date(res.json.invitation.expiresAt).getTime() - Date.now()) / 86400_000;
    expect(days).toBeGreaterThan(6.99);
    expect(days).toBeLessThanOrEqual(7);

    session.userId = null;
    const noName = await call(acceptRoute, "POST", {}, { token, password: "a-long-password-1" });
    expect(noName.status).toBe(400);
    const ok = await call(acceptRoute, "POST", {}, { token, name: "Ada Newcomer", password: "a-long-password-1" });
    expect(ok.status, JSON.stringify(ok.json)).toBe(200);
    const db = await getDb();
    const [user] = await db.select().from(schema.users).where(eq(schema.users.email, "new.digger@example.org"));
    expect(await checkPassword("a-long-password-1", user.passwordHash)).toBe(true);
    const [mem] = await db
      .select()
      .from(schema.memberships)
      .where(and(eq(schema.memberships.siteId, fx.site.id), eq(schema.memberships.userId, user.id)));
    expect(mem.role).toBe("specialist");
    const again = await call(acceptRoute, "POST", {}, { token, name: "Ada", password: "a-long-password-1" });
    expect(again.status).toBe(409);
  });

  it("an existing account proves itself with its password; an expired link is refused", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const known = await makeAccount("known@example.org", "known-password-9", "Known Person");
    session.userId = fx.people.director.id;
    await call(invitationsRoute, "POST", { siteId: fx.site.id }, { email: "known@example.org", role: "digger" });
    const token = tokenIn(messagesTo(mail.dir, "known@example.org")[0].text, "invite");
    session.userId = null;
    expect((await call(acceptRoute, "POST", {}, { token, password: "wrong-password" })).status).toBe(400);
    expect((await call(acceptRoute, "POST", {}, { token, password: "known-password-9" })).status).toBe(200);
    const rows = await db.select().from(schema.memberships).where(eq(schema.memberships.userId, known.id));
    expect(rows.map((r) => r.role)).toEqual(["digger"]);

    session.userId = fx.people.director.id;
    await call(invitationsRoute, "POST", { siteId: fx.site.id }, { email: "late@example.org", role: "digger" });
    const late = tokenIn(messagesTo(mail.dir, "late@example.org")[0].text, "invite");
    await db
      .update(schema.invitations)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(schema.invitations.email, "late@example.org"));
    session.userId = null;
    const refused = await call(acceptRoute, "POST", {}, { token: late, name: "Late", password: "late-password-1" });
    expect(refused.status).toBe(409);
    expect(refused.json.error).toContain("expired");
  });

  it("adds no one without consent: a known and an unknown address get the same answer, and only acceptance joins", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const known = await makeAccount("has.account@example.org", "known-password-9", "Has Account");
    // No route puts an account on a site at once: the members collection takes no POST.
    expect("POST" in membersRoute).toBe(false);
    const adds = (Object.values(api) as ApiOperation[]).filter(
      (op) => op.method === "POST" && op.path.endsWith("/members"),
    );
    expect(adds).toEqual([]);
    expect(buildOpenApiDocument().paths?.["/api/sites/{siteId}/members"]).not.toHaveProperty("post");

    session.userId = fx.people.director.id;
    const a = await call(
      invitationsRoute,
      "POST",
      { siteId: fx.site.id },
      { email: "has.account@example.org", role: "digger" },
    );
    const b = await call(
      invitationsRoute,
      "POST",
      { siteId: fx.site.id },
      { email: "no.account@example.org", role: "digger" },
    );
    // Same status, same body once the address, the ids and the times are taken out: nothing tells whether an account
    // exists.
    const blank = (r: typeof a, email: string) =>
      JSON.stringify(r.json)
        .replaceAll(email, "EMAIL")
        .replace(/"[0-9a-f-]{36}"/g, '"ID"')
        .replace(/"\d{4}-\d\d-\d\dT[\d:.]+Z"/g, '"TIME"');
    expect(a.status).toBe(201);
    expect(b.status).toBe(a.status);
    expect(blank(a, "has.account@example.org")).toBe(blank(b, "no.account@example.org"));
    const [toKnown] = messagesTo(mail.dir, "has.account@example.org");
    const [toUnknown] = messagesTo(mail.dir, "no.account@example.org");
    expect(toKnown.subject).toBe(toUnknown.subject);

    // Until she accepts, she is not on the site and the site does not show her name.
    const listed = async () =>
      (await call(membersRoute, "GET", { siteId: fx.site.id })).json.map((m: { email: string }) => m.email);
    expect(await listed()).not.toContain("has.account@example.org");
    expect(await db.select().from(schema.memberships).where(eq(schema.memberships.userId, known.id))).toEqual([]);
    session.userId = null;
    expect(
      (await call(acceptRoute, "POST", {}, { token: tokenIn(toKnown.text, "invite"), password: "known-password-9" }))
        .status,
    ).toBe(200);
    session.userId = fx.people.director.id;
    expect(await listed()).toContain("has.account@example.org");
  });

  it("refuses to invite someone already on the site", async () => {
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    const res = await call(
      invitationsRoute,
      "POST",
      { siteId: fx.site.id },
      { email: fx.people.digger.email, role: "director" },
    );
    expect(res.status).toBe(409);
    expect(messagesTo(mail.dir, fx.people.digger.email)).toHaveLength(0);
  });
});

describe("password reset by e-mail", () => {
  it("mails a one-hour link to an account, sets the new password once, and answers alike for unknown addresses", async () => {
    const db = await getDb();
    const u = await makeAccount("forgetful@example.org", "old-password-1", "Forgetful Digger");
    const unknown = await call(resetRequestRoute, "POST", {}, { email: "nobody@example.org" });
    const known = await call(resetRequestRoute, "POST", {}, { email: "Forgetful@example.org" });
    expect(unknown).toEqual(known);
    expect(messagesTo(mail.dir, "nobody@example.org")).toHaveLength(0);
    const [m] = messagesTo(mail.dir, "forgetful@example.org");
    expect(m.subject).toBe("Choose a new Loamwork password");
    expect(m.text).toContain("Hello Forgetful Digger,");
    const token = tokenIn(m.text, "reset-password");
    expect(m.html).toContain(`href="${APP}/reset-password/${token}"`);

    expect((await call(resetConfirmRoute, "POST", {}, { token, password: "short" })).status).toBe(400);
    const ok = await call(resetConfirmRoute, "POST", {}, { token, password: "new-password-22" });
    expect(ok.status, JSON.stringify(ok.json)).toBe(200);
    const [after] = await db.select().from(schema.users).where(eq(schema.users.id, u.id));
    expect(await checkPassword("new-password-22", after.passwordHash)).toBe(true);
    expect((await call(resetConfirmRoute, "POST", {}, { token, password: "third-password-3" })).status).toBe(409);
  });

  it("sends at most three links an hour to one account", async () => {
    const db = await getDb();
    await db.insert(schema.users).values({ email: "flooded@example.org", name: "Flooded", passwordHash: "x" });
    for (let i = 0; i < 5; i++) await call(resetRequestRoute, "POST", {}, { email: "flooded@example.org" });
    expect(messagesTo(mail.dir, "flooded@example.org")).toHaveLength(3);
  });
});
