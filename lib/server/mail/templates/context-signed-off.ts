import { compose, mailDate, type MailContent } from "./layout";

export type ContextSignedOffMail = {
  siteCode: string;
  contextNumber: number;
  trenchCode: string;
  signedOffBy: string;
  at: Date;
  trenchSignedOff: boolean;
  link: string;
};

/** To the context's recorders: the sheet, its finds and relations are now locked. */
export function contextSignedOffMail(m: ContextSignedOffMail): MailContent {
  const blocks = [
    { p: `${m.signedOffBy} signed off context ${m.contextNumber} (trench ${m.trenchCode}) on ${mailDate(m.at)}.` },
    { p: "The sheet, its finds and its relations are locked; only a director can reopen them, with a reason." },
  ];
  if (m.trenchSignedOff)
    blocks.push({ p: `Every context of trench ${m.trenchCode} is now signed off, so the trench is signed off too.` });
  return compose(`${m.siteCode}: context ${m.contextNumber} signed off`, "Hello,", [
    ...blocks,
    { link: m.link, label: "Open the context sheet" },
  ]);
}
