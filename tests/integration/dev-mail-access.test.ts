import { describe, expect, it } from "vitest";
import { session } from "@/tests/support/harness";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import DevMailPage from "@/app/dev/mail/page";

const open = () => DevMailPage({ searchParams: Promise.resolve({}) });

describe("the caught-mail page (/dev/mail)", () => {
  it("sends a signed-out visitor to sign-in instead of listing mail, which holds reset and invitation links", async () => {
    session.userId = null;
    const err = await open().then(
      () => null,
      (e: unknown) => e as { digest?: string },
    );
    expect(err?.digest).toMatch(/^NEXT_REDIRECT;\w+;\/sign-in;/);
  });

  it("shows the caught mail to a signed-in user of the demo", async () => {
    const db = await getDb();
    const [u] = await db
      .insert(users)
      .values({ email: "mail-reader@dig.test", name: "Reader", passwordHash: "x" })
      .returning();
    session.userId = u.id;
    const page = await open();
    expect(page).toBeTruthy();
    expect(JSON.stringify(page)).toContain("Caught mail");
  });
});
