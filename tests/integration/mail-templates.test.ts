import { describe, expect, it } from "vitest";
import { compose, escapeHtml, mailDate } from "@/lib/server/mail/templates/layout";
import { invitationMail } from "@/lib/server/mail/templates/invitation";
import { passwordResetMail } from "@/lib/server/mail/templates/password-reset";
import { contextSubmittedMail } from "@/lib/server/mail/templates/context-submitted";
import { contextSignedOffMail } from "@/lib/server/mail/templates/context-signed-off";
import { contextReopenedMail } from "@/lib/server/mail/templates/context-reopened";

const at = new Date("2026-07-14T09:05:00Z");

describe("mail templates: the text and HTML forms say the same thing", () => {
  it("writes dates for people, in UTC", () => {
    expect(mailDate(at)).toBe("14 July 2026, 09:05 UTC");
  });

  it("escapes everything that came from a person", () => {
    expect(escapeHtml(`<b>"Tom" & 'Jo'</b>`)).toBe("&lt;b&gt;&quot;Tom&quot; &amp; &#39;Jo&#39;&lt;/b&gt;");
    const m = compose("s", "Hello <x>,", [{ quote: "a <script>alert(1)</script>\nsecond line" }]);
    expect(m.html).not.toContain("<script>");
    expect(m.html).toContain("a &lt;script&gt;");
    expect(m.text).toContain("> a <script>alert(1)</script>\n> second line");
  });

  it("invitation: site, role, inviter, link and expiry in both forms", () => {
    const link = "https://loamwork.example/invite/tok_abc";
    const m = invitationMail({
      siteCode: "WHD26",
      siteName: "Whinnydale Holm",
      role: "digger",
      invitedBy: "Imogen Carrow",
      link,
      expiresAt: at,
    });
    expect(m.subject).toBe("Invitation to WHD26 Whinnydale Holm on Loamwork");
    for (const body of [m.text, m.html]) {
      expect(body).toContain(
        "Imogen Carrow invites you to join the excavation record of WHD26 Whinnydale Holm as digger.",
      );
      expect(body).toContain("expires on 14 July 2026, 09:05 UTC");
    }
    expect(m.text).toContain(`Accept the invitation: ${link}`);
    expect(m.html).toContain(`<a href="${link}"`);
  });

  it("password reset: the name, the link, and that nothing changes if ignored", () => {
    const m = passwordResetMail({ name: "Nell Ashgrove", link: "https://l.example/reset-password/t1", expiresAt: at });
    expect(m.subject).toBe("Choose a new Loamwork password");
    expect(m.text.startsWith("Hello Nell Ashgrove,")).toBe(true);
    expect(m.html).toContain('href="https://l.example/reset-password/t1"');
    expect(m.text).toContain("your password stays as it is");
  });

  it("submitted, signed off, reopened and returned", () => {
    const s = contextSubmittedMail({
      siteCode: "WHD26",
      contextNumber: 1005,
      trenchCode: "A",
      submittedBy: "Nell",
      finds: 1,
      link: "L",
    });
    expect(s.subject).toBe("WHD26: context 1005 awaits your sign-off");
    expect(s.text).toContain("(trench A, 1 find)");
    const so = contextSignedOffMail({
      siteCode: "WHD26",
      contextNumber: 1005,
      trenchCode: "A",
      signedOffBy: "Imogen",
      at,
      trenchSignedOff: false,
      link: "L",
    });
    expect(so.text).toContain("Imogen signed off context 1005 (trench A) on 14 July 2026, 09:05 UTC.");
    expect(so.text).not.toContain("trench is signed off");
    const base = {
      siteCode: "WHD26",
      contextNumber: 1005,
      trenchCode: "A",
      reopenedBy: "Imogen",
      at,
      reason: "Two finds belong to 1004.\nSee the section drawing.",
      link: "L",
    };
    const re = contextReopenedMail({ ...base, from: "signed_off" });
    expect(re.subject).toBe("WHD26: context 1005 reopened — Two finds belong to 1004.");
    expect(re.text).toContain("Imogen reopened the signed-off context 1005");
    expect(re.html).toContain("See the section drawing.");
    const long = contextReopenedMail({
      ...base,
      from: "signed_off",
      reason: "The subsoil boundary was drawn ten centimetres too high; re-check the section.",
    });
    expect(long.subject).toBe(
      "WHD26: context 1005 reopened — The subsoil boundary was drawn ten centimetres too high; re…",
    );
    const ret = contextReopenedMail({ ...base, from: "awaiting" });
    expect(ret.subject.startsWith("WHD26: context 1005 returned")).toBe(true);
    expect(ret.text).toContain("returned the context submitted for sign-off 1005");
  });
});
