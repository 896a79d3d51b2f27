/** A message in both forms every mail program can show: plain text and HTML. */
export type MailContent = { subject: string; text: string; html: string };

const entities = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" } as const;

/** Escapes text for HTML; every value from a record or a person goes through it. */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => entities[c as keyof typeof entities]);
}

/** One block of a message: a paragraph, a quoted passage (a reason) or a link to act on. */
export type Block = { p: string } | { quote: string } | { link: string; label: string };

/**
 * Builds the text and HTML forms from the same blocks, so they cannot say different things.
 * The HTML is table-free and inline-styled: mail programs ignore style sheets.
 */
export function compose(subject: string, greeting: string, blocks: Block[]): MailContent {
  const text = [greeting, ""];
  const html = [`<p style="margin:0 0 12px">${escapeHtml(greeting)}</p>`];
  for (const b of blocks) {
    if ("p" in b) {
      text.push(b.p, "");
      html.push(`<p style="margin:0 0 12px">${escapeHtml(b.p)}</p>`);
    } else if ("quote" in b) {
      text.push(...b.quote.split("\n").map((l) => `> ${l}`), "");
      html.push(
        `<blockquote style="margin:0 0 12px;padding:4px 12px;border-left:4px solid #8a7660;white-space:pre-wrap">${escapeHtml(b.quote)}</blockquote>`,
      );
    } else {
      text.push(`${b.label}: ${b.link}`, "");
      html.push(
        `<p style="margin:0 0 12px"><a href="${escapeHtml(b.link)}" style="color:#1d5c8c;font-weight:bold">${escapeHtml(b.label)}</a><br><span style="font-family:monospace;font-size:12px;color:#5a4632">${escapeHtml(b.link)}</span></p>`,
      );
    }
  }
  text.push("— Loamwork");
  html.push(`<p style="margin:0;color:#8a7660">— Loamwork</p>`);
  const body = `<!doctype html><html><body style="font-family:Georgia,serif;color:#2e2116;background:#f7f2e8;padding:16px">${html.join("")}</body></html>`;
  return { subject, text: text.join("\n"), html: body };
}

/** "14 July 2026, 09:30 UTC": dates in mail are read by people, not parsed. */
export function mailDate(d: Date): string {
  const month = d.toLocaleString("en-GB", { month: "long", timeZone: "UTC" });
  const hh = String(d.getUTCHours()).padStart(2, "0");
  const mm = String(d.getUTCMinutes()).padStart(2, "0");
  return `${d.getUTCDate()} ${month} ${d.getUTCFullYear()}, ${hh}:${mm} UTC`;
}
