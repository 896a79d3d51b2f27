import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { asRequest, CookieJar, sessionUserId, signInOverHttp, signOutOverHttp } from "@/tests/support/auth-client";
import { getDb } from "@/db/client";
import { makeAccount } from "../support/fixtures";
import { passwordResets, users } from "@/db/schema";
import { currentUserId } from "@/lib/server/session";
import { hashToken } from "@/lib/server/invitations";
import { confirmPasswordReset } from "@/lib/server/password-reset";
import * as sitesRoute from "@/app/api/sites/route";

/** GET /api/sites (a guarded route) with exactly this cookie: its status. */
async function listSites(cookie: string): Promise<number> {
  return asRequest(cookie, async () => {
    const res = await sitesRoute.GET(new Request("http://localhost:3000/api/sites"), { params: Promise.resolve({}) });
    return res.status;
  });
}

/** A guarded write with exactly this cookie: its status. */
async function createSite(cookie: string, code: string): Promise<number> {
  return asRequest(cookie, async () => {
    const body = JSON.stringify({ code, name: `Site ${code}` });
    const res = await sitesRoute.POST(
      new Request("http://localhost:3000/api/sites", {
        method: "POST",
        body,
        headers: { "content-type": "application/json" },
      }),
      { params: Promise.resolve({}) },
    );
    return res.status;
  });
}

beforeAll(async () => {
  await getDb();
}, 120_000);

describe("a saved session cookie after the session ends", () => {
  it("is refused after signing out: reads and writes answer 401 and the session endpoint reports no user", async () => {
    const user = await makeAccount("cai@dig.test", "cai-password-1");
    const jar = new CookieJar();
    await signInOverHttp(jar, "cai@dig.test", "cai-password-1");
    const saved = jar.sessionCookie();
    expect(saved).not.toBe("");
    expect(await sessionUserId(saved)).toBe(user.id);
    expect(await asRequest(saved, currentUserId)).toBe(user.id);
    expect(await listSites(saved)).toBe(200);

    await signOutOverHttp(jar);
    expect(jar.sessionCookie()).toBe("");

    expect(await sessionUserId(saved)).toBeNull();
    expect(await asRequest(saved, currentUserId)).toBeNull();
    expect(await listSites(saved)).toBe(401);
    expect(await createSite(saved, "RVK1")).toBe(401);

    // Signing in again gives a working session.
    const again = new CookieJar();
    await signInOverHttp(again, "cai@dig.test", "cai-password-1");
    expect(await asRequest(again.sessionCookie(), currentUserId)).toBe(user.id);
  });

  it("is refused after a password reset, on every device that held one", async () => {
    const user = await makeAccount("dee@dig.test", "dee-password-1");
    const laptop = new CookieJar();
    const tablet = new CookieJar();
    await signInOverHttp(laptop, "dee@dig.test", "dee-password-1");
    await signInOverHttp(tablet, "dee@dig.test", "dee-password-1");
    expect(await listSites(tablet.sessionCookie())).toBe(200);

    const db = await getDb();
    const token = "reset-token-for-dee-0123456789";
    await db
      .insert(passwordResets)
      .values({ userId: user.id, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + 60_000) });
    await confirmPasswordReset(db, { token, password: "dee-new-password-2" });

    for (const saved of [laptop.sessionCookie(), tablet.sessionCookie()]) {
      expect(await sessionUserId(saved)).toBeNull();
      expect(await asRequest(saved, currentUserId)).toBeNull();
      expect(await listSites(saved)).toBe(401);
      expect(await createSite(saved, "RVK2")).toBe(401);
    }

    const fresh = new CookieJar();
    await signInOverHttp(fresh, "dee@dig.test", "dee-new-password-2");
    expect(await asRequest(fresh.sessionCookie(), currentUserId)).toBe(user.id);
    const [row] = await db.select().from(users).where(eq(users.id, user.id));
    expect(row.sessionVersion).toBe(1);
  });
});
