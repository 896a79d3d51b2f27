import { compose, mailDate, type MailContent } from "./layout";

export type PasswordResetMail = { name: string; link: string; expiresAt: Date };

/** A link to choose a new password; the old one keeps working until the link is used. */
export function passwordResetMail(m: PasswordResetMail): MailContent {
  return compose("Choose a new Loamwork password", `Hello ${m.name},`, [
    { p: "Someone asked to reset the password of your Loamwork account." },
    { link: m.link, label: "Choose a new password" },
    {
      p: `The link works once and expires on ${mailDate(m.expiresAt)}. If you did not ask, ignore this message: your password stays as it is.`,
    },
  ]);
}
