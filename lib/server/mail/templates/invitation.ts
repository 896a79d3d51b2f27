import { compose, mailDate, type MailContent } from "./layout";

export type InvitationMail = {
  siteCode: string;
  siteName: string;
  role: string;
  invitedBy: string;
  link: string;
  expiresAt: Date;
};

/** An invitation to join a site in a role, with a link that stops working at `expiresAt`. */
export function invitationMail(m: InvitationMail): MailContent {
  return compose(`Invitation to ${m.siteCode} ${m.siteName} on Loamwork`, "Hello,", [
    { p: `${m.invitedBy} invites you to join the excavation record of ${m.siteCode} ${m.siteName} as ${m.role}.` },
    { link: m.link, label: "Accept the invitation" },
    {
      p: `The link works once and expires on ${mailDate(m.expiresAt)}. If you were not expecting it, ignore this message and nothing happens.`,
    },
  ]);
}
