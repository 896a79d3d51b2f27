import { describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import { hashPassword } from "@/lib/server/passwords";
import { signInDelayMs, verifySignIn } from "@/lib/server/sign-in";

describe("sign-in", () => {
  it("accepts the right password, case-insensitively on the e-mail", async () => {
    const db = await getDb();
    await db.insert(users).values({ email: "ana@dig.test", name: "Ana", passwordHash: await hashPassword("right-pass") });
    const waits: number[] = [];
    const user = await verifySignIn({ email: "  ANA@dig.test ", password: "right-pass" }, async (ms) => waits.push(ms));
    expect(user?.email).toBe("ana@dig.test");
    expect(waits).toEqual([0]);
  });

  it("slows every further try after three failures, doubling up to 8 s, and forgets on success", async () => {
    const db = await getDb();
    await db.insert(users).values({ email: "bo@dig.test", name: "Bo", passwordHash: await hashPassword("right-pass") });
    const waits: number[] = [];
    const record = async (ms: number) => waits.push(ms);
    for (let k = 0; k < 7; k++) expect(await verifySignIn({ email: "bo@dig.test", password: `guess-${k}` }, record)).toBeNull();
    expect(waits).toEqual([0, 0, 0, 1000, 2000, 4000, 8000]);
    expect(await verifySignIn({ email: "bo@dig.test", password: "right-pass" }, record)).not.toBeNull();
    expect(await verifySignIn({ email: "bo@dig.test", password: "wrong" }, record)).toBeNull();
    expect(waits.slice(7)).toEqual([8000, 0]);
  });

  it("slows guesses at an address with no account too, so accounts cannot be told apart by speed", async () => {
    const waits: number[] = [];
    for (let k = 0; k < 4; k++) await verifySignIn({ email: "nobody@dig.test", password: "x" }, async (ms) => waits.push(ms));
    expect(waits).toEqual([0, 0, 0, 1000]);
  });

  it("has no delay below three failures and caps at 8 s", () => {
    expect([0, 1, 2, 3, 4, 5, 6, 20].map(signInDelayMs)).toEqual([0, 0, 0, 1000, 2000, 4000, 8000, 8000]);
  });
});
