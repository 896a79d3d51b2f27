import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { inject } from "vitest";
import type { Browser } from "playwright-core";
import { DEMO_USERS } from "@/scripts/seed/seed-demo";
import { messagesTo } from "@/lib/server/mail/sink-reader";
import { newPage, openBrowser, shown, signIn } from "./support/browser";
import { freshContext } from "./support/fresh-context";

let browser: Browser;
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const mailDir = () => path.join(inject("dataDir"), "mail");
const digger = DEMO_USERS.find((u) => u.role === "digger")!;
const director = DEMO_USERS.find((u) => u.role === "director")!;

/** Waits for the sink to hold a message to `to` whose subject contains `subject` (mail is sent after the commit). */
async function mailTo(to: string, subject: string) {
  for (let i = 0; i < 50; i++) {
    const hit = messagesTo(mailDir(), to).find((m) => m.subject.includes(subject));
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no mail to ${to} with "${subject}" in the sink`);
}

describe("sign-off in the browser", () => {
  it("a digger submits, the director signs off, the digger cannot edit, the director reopens with a reason and the digger is told", async () => {
    const d = await newPage(browser);
    await signIn(d, "digger");
    const { siteId, contextId, number } = await freshContext(
      d,
      {
        type: "layer",
        colour: "mid brown",
        compaction: "firm",
        composition: "silty sand",
        description: "Layer under the topsoil.",
        interpretation: "Subsoil.",
      },
      { below: 3001 },
    );

    await d.goto(`/sites/${siteId}/sign-off`);
    await d.getByRole("button", { name: `Submit ${number} for sign-off` }).click();
    await shown(d.getByText(/\d e-mails? sent/));
    expect(await d.getByText(/e-mail\(s\)/).count()).toBe(0);
    await shown(d.locator(`tr[data-context="${number}"]`).getByText("awaiting sign-off"));
    expect((await mailTo(director.email, `context ${number} awaits your sign-off`)).text).toContain(
      `/sites/${siteId}/sign-off`,
    );

    const boss = await newPage(browser);
    await signIn(boss, "director");
    await boss.goto(`/sites/${siteId}/sign-off`);
    // Signing off asks first, saying what will be locked; nothing is locked until the director confirms.
    await boss.getByRole("button", { name: `Sign off ${number}` }).click();
    const ask = boss.getByRole("alertdialog");
    await shown(ask);
    expect(await ask.textContent()).toContain(
      `Sign off context ${number}? Its sheet, its finds and its relations will be locked`,
    );
    const still = await (await boss.request.get(`/api/sites/${siteId}/contexts/${contextId}`)).json();
    expect(still.state).toBe("awaiting");
    await ask.getByRole("button", { name: `Lock context ${number}` }).click();
    await shown(boss.getByText(/e-mails? sent/));
    await mailTo(digger.email, `context ${number} signed off`);

    // The sheet is shown read-only with who signed it off, and the server refuses an edit all the same.
    await d.goto(`/sites/${siteId}/contexts/${contextId}`);
    await shown(d.getByText(`Signed off by ${director.name}`));
    expect(await d.getByLabel("Colour").count()).toBe(0);
    const refused = await d.request.patch(`/api/sites/${siteId}/contexts/${contextId}`, {
      data: { colour: "dark brown" },
    });
    expect(refused.status()).toBe(409);
    expect((await refused.json()).error).toContain(`Context ${number} was signed off by ${director.name}`);
    await d.goto(`/sites/${siteId}/sign-off`);
    expect(await d.getByRole("button", { name: `Reopen ${number}…` }).count()).toBe(0);

    const reason = "The subsoil boundary was planned 10 cm too high; re-check against the section.";
    await boss.goto(`/sites/${siteId}/sign-off`);
    await boss.getByRole("button", { name: `Reopen ${number}…` }).click();
    await boss.getByLabel(`Why reopen context ${number}?`, { exact: false }).fill(reason);
    await boss.getByRole("button", { name: "Reopen with this reason" }).click();
    await shown(boss.getByText(/e-mails? sent/));

    const told = await mailTo(digger.email, `context ${number} reopened`);
    expect(told.text).toContain(`> ${reason}`);
    const link = told.text.match(/https?:\/\/\S+\/contexts\/[0-9a-f-]{36}/)?.[0];
    expect(link).toBe(`${new URL(d.url()).origin}/sites/${siteId}/contexts/${contextId}`);
    await d.goto(link!);
    await shown(d.getByLabel("Colour"));
    await shown(d.getByText(reason));
    await d.context().close();
    await boss.context().close();
  });
});
