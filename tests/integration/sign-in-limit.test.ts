import { beforeAll, describe, expect, it } from "vitest";
import { CookieJar, asRequest, signInOverHttp } from "@/tests/support/auth-client";
import { getDb } from "@/db/client";
import { makeAccount } from "../support/fixtures";
import { passwordResets } from "@/db/schema";
import { hashToken } from "@/lib/server/invitations";
import { confirmPasswordReset } from "@/lib/server/password-reset";
import { clientAddress } from "@/lib/server/client-address";
import { PEER_HEADER, stampPeerAddresses } from "@/lib/server/peer-stamp";
import { ACCOUNT_LIMIT, PAIR_LIMIT, admitSignIn } from "@/lib/server/sign-in-limit";
import { signInAction } from "@/app/sign-in/actions";

beforeAll(async () => {
  // As the server does (instrumentation.ts); each request below names the address it "connected" from.
  stampPeerAddresses();
  await getDb();
}, 120_000);

const from = (address: string, more: Record<string, string> = {}) => ({ [PEER_HEADER]: address, ...more });
const signedIn = (res: Response, jar: CookieJar) => res.status === 302 && jar.sessionCookie() !== "";

describe("sign-in limits", () => {
  it("counts guesses sent at once: of 8 parallel guesses from one address only 5 are checked, 3 get 429 with Retry-After", async () => {
    await makeAccount("eve-target@dig.test", "owner-password-1");
    const answers = await Promise.all(
      Array.from({ length: 8 }, (_, k) =>
        signInOverHttp(new CookieJar(), "eve-target@dig.test", `guess-${k}`, from("203.0.113.7")),
      ),
    );
    const refused = answers.filter((r) => r.status === 429);
    expect(refused).toHaveLength(8 - PAIR_LIMIT.points);
    for (const r of answers.filter((a) => a.status !== 429))
      expect(r.headers.get("location")).toMatch(/error=CredentialsSignin/);
    for (const r of refused) {
      const wait = Number(r.headers.get("retry-after"));
      expect(wait).toBeGreaterThan(0);
      expect(wait).toBeLessThanOrEqual(PAIR_LIMIT.blockDuration);
      expect(((await r.json()) as { error: string }).error).toMatch(/Too many sign-in tries.*Try again in 15 minutes/);
    }
    // The right password from the guessing address is refused too, before it is checked.
    const jar = new CookieJar();
    expect((await signInOverHttp(jar, "eve-target@dig.test", "owner-password-1", from("203.0.113.7"))).status).toBe(
      429,
    );
  });

  it("lets the owner in at once from a fresh address while the guessing address is refused", async () => {
    const owner = await makeAccount("owner@dig.test", "owner-password-2");
    for (let k = 0; k < PAIR_LIMIT.points + 1; k++)
      await signInOverHttp(new CookieJar(), "owner@dig.test", `guess-${k}`, from("198.51.100.9"));
    const jar = new CookieJar();
    const started = Date.now();
    const res = await signInOverHttp(jar, "owner@dig.test", "owner-password-2", from("192.0.2.44"));
    expect(signedIn(res, jar)).toBe(true);
    expect(Date.now() - started).toBeLessThan(5000);
    expect(
      await asRequest(jar.sessionCookie(), async () => (await import("@/lib/server/session")).currentUserId()),
    ).toBe(owner.id);
  });

  it("ignores X-Forwarded-For unless proxies are configured: a guesser cannot claim a new address per try", async () => {
    await makeAccount("xff@dig.test", "owner-password-3");
    const statuses: number[] = [];
    for (let k = 0; k < PAIR_LIMIT.points + 2; k++) {
      const res = await signInOverHttp(
        new CookieJar(),
        "xff@dig.test",
        `guess-${k}`,
        from("203.0.113.50", { "x-forwarded-for": `10.9.8.${k}` }),
      );
      statuses.push(res.status);
    }
    expect(statuses.filter((s) => s === 429)).toHaveLength(2);
  });

  it("reads the client from X-Forwarded-For only as deep as the configured number of proxies", () => {
    const h = new Headers({ [PEER_HEADER]: "10.0.0.2", "x-forwarded-for": "6.6.6.6, 198.51.100.20, 10.0.0.1" });
    expect(clientAddress(h, 0)).toBe("10.0.0.2");
    expect(clientAddress(h, 1)).toBe("10.0.0.1");
    expect(clientAddress(h, 2)).toBe("198.51.100.20");
    // More proxies configured than the header names: the leftmost, never beyond it.
    expect(clientAddress(new Headers({ [PEER_HEADER]: "10.0.0.2", "x-forwarded-for": "198.51.100.20" }), 3)).toBe(
      "198.51.100.20",
    );
    expect(clientAddress(new Headers({ [PEER_HEADER]: "10.0.0.2" }), 1)).toBe("10.0.0.2");
  });

  it("stops guessing spread over many addresses at the account's ceiling", async () => {
    const addresses = Math.ceil(ACCOUNT_LIMIT.points / PAIR_LIMIT.points);
    for (let a = 0; a < addresses; a++) {
      for (let k = 0; k < PAIR_LIMIT.points; k++)
        expect(await admitSignIn("spread@dig.test", new Headers(from(`203.0.113.${a}`)))).toBeNull();
    }
    const refused = await admitSignIn("spread@dig.test", new Headers(from("192.0.2.200")));
    expect(refused?.retryAfterSeconds).toBeGreaterThan(0);
    expect(refused?.retryAfterSeconds).toBeLessThanOrEqual(ACCOUNT_LIMIT.duration);
    // Another account from the same fresh address is not affected.
    expect(await admitSignIn("other@dig.test", new Headers(from("192.0.2.200")))).toBeNull();
  });

  it("refuses the sign-in form too, with the wait in words, and a password reset lifts the limit", async () => {
    const user = await makeAccount("form@dig.test", "owner-password-4");
    const here = from("203.0.113.99");
    for (let k = 0; k < PAIR_LIMIT.points; k++) await admitSignIn("form@dig.test", new Headers(here));
    const form = new FormData();
    form.set("email", "form@dig.test");
    form.set("password", "owner-password-4");
    const state = await asRequest("", () => signInAction({}, form), here);
    expect(state.error).toMatch(/Too many sign-in tries for this account from here\. Try again in 15 minutes/);

    const db = await getDb();
    const token = "reset-token-for-form-0123456789";
    await db
      .insert(passwordResets)
      .values({ userId: user.id, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + 60_000) });
    await confirmPasswordReset(db, { token, password: "owner-password-5" });
    const jar = new CookieJar();
    expect(signedIn(await signInOverHttp(jar, "form@dig.test", "owner-password-5", here), jar)).toBe(true);
  });
});
