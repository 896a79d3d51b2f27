import { compose, type MailContent } from "./layout";

export type ContextSubmittedMail = {
  siteCode: string;
  contextNumber: number;
  trenchCode: string;
  submittedBy: string;
  finds: number;
  link: string;
};

/** To the site's directors: a context sheet waits for their sign-off. */
export function contextSubmittedMail(m: ContextSubmittedMail): MailContent {
  return compose(`${m.siteCode}: context ${m.contextNumber} awaits your sign-off`, "Hello,", [
    {
      p: `${m.submittedBy} submitted context ${m.contextNumber} (trench ${m.trenchCode}, ${m.finds} find${m.finds === 1 ? "" : "s"}) for sign-off.`,
    },
    { p: "The sheet is frozen until you sign it off or return it with a reason." },
    { link: m.link, label: "Open the sign-off queue" },
  ]);
}
