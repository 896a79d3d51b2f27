/** One message as the local SMTP sink stores it (one JSON file per message). */
export type SinkMessage = {
  id: string;
  receivedAt: string;
  /** The SMTP envelope: who the relay was told to deliver to (Bcc included). */
  envelope: { from: string; to: string[] };
  /** The header addresses, as a mail program would show them. */
  from: string[];
  to: string[];
  subject: string;
  text: string;
  html: string;
  messageId: string | null;
};
