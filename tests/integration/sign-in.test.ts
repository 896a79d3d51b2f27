import { describe, expect, it } from "vitest";
import { makeAccount } from "../support/fixtures";
import { verifySignIn } from "@/lib/server/sign-in";

describe("sign-in", () => {
  it("accepts the right password, case-insensitively on the e-mail, with the account's session version", async () => {
    await makeAccount("ana@dig.test", "right-pass", "Ana");
    const user = await verifySignIn({ email: "  ANA@dig.test ", password: "right-pass" });
    expect(user?.email).toBe("ana@dig.test");
    expect(user?.sessionVersion).toBe(0);
  });

  it("refuses a wrong password, an unknown address and a malformed e-mail alike", async () => {
    await makeAccount("bo@dig.test", "right-pass", "Bo");
    expect(await verifySignIn({ email: "bo@dig.test", password: "wrong" })).toBeNull();
    expect(await verifySignIn({ email: "nobody@dig.test", password: "right-pass" })).toBeNull();
    expect(await verifySignIn({ email: "bo", password: "right-pass" })).toBeNull();
  });
});
