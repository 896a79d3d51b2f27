import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { inject } from "vitest";
import type { Browser } from "playwright-core";
import { messagesTo } from "@/lib/server/mail/sink-reader";
import { newPage, openBrowser, shown, signIn } from "./support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function linkIn(to: string, route: string): Promise<string> {
  for (let i = 0; i < 50; i++) {
    for (const m of messagesTo(path.join(inject("dataDir"), "mail"), to)) {
      const link = m.text.match(new RegExp(`https?://\\S+/${route}/[A-Za-z0-9_-]+`))?.[0];
      if (link) return link;
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no ${route} link mailed to ${to}`);
}

describe("invitations and password reset in the browser", () => {
  it("a director invites by e-mail; the newcomer joins from the link, later resets the password and signs in with it", async () => {
    const email = `newcomer.${Date.now()}@example.org`;
    const boss = await newPage(browser);
    await signIn(boss, "director");
    const [site] = await (await boss.request.get("/api/sites")).json();
    await boss.goto(`/sites/${site.id}/members`);
    await boss.getByLabel("Invite a person by e-mail").fill(email);
    await boss.getByLabel("Invite as").selectOption("specialist");
    await boss.getByRole("button", { name: "Send invitation" }).click();
    await shown(boss.getByText(`Invitation sent to ${email}.`));
    await shown(boss.getByRole("cell", { name: email }));

    const invite = await linkIn(email, "invite");
    const guest = await newPage(browser);
    await guest.goto(invite);
    await shown(guest.getByRole("heading", { name: /Join WHD26/ }));
    await guest.getByLabel(/Your name/).fill("Rowan Newcomer");
    await guest.getByLabel(/Choose a password/).fill("first-password-1");
    await guest.getByRole("button", { name: "Join the site" }).click();
    await guest.waitForURL(`**/sites/${site.id}`);
    await shown(guest.getByRole("navigation", { name: "Site sections" }).getByText("specialist"));
    // The link works once.
    await guest.goto(invite);
    await shown(guest.getByRole("heading", { name: "This invitation cannot be used" }));
    await guest.context().close();

    const forgetful = await newPage(browser);
    await forgetful.goto("/reset-password");
    await forgetful.getByLabel("E-mail of your account").fill(email);
    await forgetful.getByRole("button", { name: "Send me a reset link" }).click();
    await shown(forgetful.getByText(/a message with a link is on its way/));
    await forgetful.goto(await linkIn(email, "reset-password"));
    await forgetful.getByLabel(/New password/).fill("second-password-2");
    await forgetful.getByLabel("The same again").fill("second-password-2");
    await forgetful.getByRole("button", { name: "Save the new password" }).click();
    await shown(forgetful.getByText("Your password is changed."));
    await forgetful.goto("/sign-in");
    await forgetful.getByLabel("E-mail").fill(email);
    await forgetful.getByLabel("Password").fill("second-password-2");
    await forgetful.getByRole("button", { name: "Sign in", exact: true }).click();
    await forgetful.waitForURL("**/sites");
    await shown(forgetful.getByText("Whinnydale Holm"));
    expect(new URL(forgetful.url()).pathname).toBe("/sites");
    // Signing out (the header's button, a server action) ends the session: the sites page asks to sign in again.
    await forgetful.getByRole("button", { name: "Sign out" }).click();
    await forgetful.waitForURL("**/sign-in**");
    await forgetful.goto("/sites");
    await forgetful.waitForURL("**/sign-in**");
    await forgetful.context().close();
    await boss.context().close();
  });
});
