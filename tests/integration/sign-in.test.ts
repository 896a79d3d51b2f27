import { describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import { hashPassword } from "@/lib/server/passwords";
import { verifySignIn } from "@/lib/server/sign-in";

describe("sign-in", () => {
  it("accepts the right password, case-insensitively on the e-mail, with the account's session version", async () => {
    const db = await getDb();
    await db
      .insert(users)
      .values({ email: "ana@dig.test", name: "Ana", passwordHash: await hashPassword("right-pass") });
    const user = await verifySignIn({ email: "  ANA@dig.test ", password: "right-pass" });
    expect(user?.email).toBe("ana@dig.test");
    expect(user?.sessionVersion).toBe(0);
  });

  it("refuses a wrong password, an unknown address and a malformed e-mail alike", async () => {
    const db = await getDb();
    await db.insert(users).values({ email: "bo@dig.test", name: "Bo", passwordHash: await hashPassword("right-pass") });
    expect(await verifySignIn({ email: "bo@dig.test", password: "wrong" })).toBeNull();
    expect(await verifySignIn({ email: "nobody@dig.test", password: "right-pass" })).toBeNull();
    expect(await verifySignIn({ email: "bo", password: "right-pass" })).toBeNull();
  });
});
