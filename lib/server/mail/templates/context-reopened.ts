import { compose, mailDate, type MailContent } from "./layout";

export type ContextReopenedMail = {
  siteCode: string;
  contextNumber: number;
  trenchCode: string;
  reopenedBy: string;
  at: Date;
  reason: string;
  /** "signed_off": a locked sheet was reopened; "awaiting": a submitted sheet was returned before sign-off. */
  from: "signed_off" | "awaiting";
  link: string;
};

/** To the site's members: a sheet is open for changes again, and why. */
export function contextReopenedMail(m: ContextReopenedMail): MailContent {
  const verb = m.from === "signed_off" ? "reopened" : "returned";
  const what = m.from === "signed_off" ? "signed-off context" : "context submitted for sign-off";
  const first = (m.reason.split("\n")[0] ?? "").trim();
  const gist = first.length > 60 ? `${first.slice(0, 59).trimEnd()}…` : first;
  return compose(`${m.siteCode}: context ${m.contextNumber} ${verb} — ${gist}`, "Hello,", [
    {
      p: `${m.reopenedBy} ${verb} the ${what} ${m.contextNumber} (trench ${m.trenchCode}) on ${mailDate(m.at)}, giving this reason:`,
    },
    { quote: m.reason },
    {
      p: "The sheet, its finds and its relations can be changed again until it is submitted and signed off once more.",
    },
    { link: m.link, label: "Open the context sheet" },
  ]);
}
