import Link from "next/link";
import type { ReactNode } from "react";
import { PrintButton } from "@/components/sign-off/print-button";
import { formatWhen } from "@/lib/words/when";

/** A string as a CSS string literal's contents: no quote, backslash, line break or markup can break out. */
function cssText(s: string): string {
  return s.replace(/[\\"<>\n\r]/g, (c) => `\\${c.charCodeAt(0).toString(16)} `);
}

/**
 * The frame of a printed register: on paper an A4 page whose margins carry the site code and the register's
 * name at the top and "Page n of m" at the foot of every sheet (CSS paged media), with the app's own header
 * and navigation left off; on screen the same page with a print button and a way back to the register.
 */
export function PrintedPage({
  site,
  title,
  locale,
  back,
  testId,
  children,
}: {
  site: { code: string; name: string };
  title: string;
  /** The reader's locale: the time of printing is written in it. */
  locale: string;
  back: { href: string; label: string };
  testId: string;
  children: ReactNode;
}) {
  const printedAt = formatWhen(new Date(), locale);
  const page = `@media print { @page { size: A4; margin: 16mm 12mm 14mm;
  @top-left { content: "${cssText(`${site.code} ${site.name}`)}"; font-size: 9pt; }
  @top-right { content: "${cssText(title)}"; font-size: 9pt; }
  @bottom-left { content: "Printed ${cssText(printedAt)}"; font-size: 8pt; }
  @bottom-right { content: "Page " counter(page) " of " counter(pages); font-size: 8pt; } } }`;
  return (
    <main className="printed-register mx-auto max-w-6xl space-y-6 px-4 py-6" data-testid={testId}>
      <style dangerouslySetInnerHTML={{ __html: page }} />
      <div className="no-print flex flex-wrap items-center gap-3">
        <PrintButton label={`Print the ${title.toLowerCase()}`} />
        <Link className="btn" href={back.href}>
          {back.label}
        </Link>
      </div>
      <header>
        <p className="font-mono text-xs uppercase tracking-widest text-ink-faint">
          {site.code} · {site.name}
        </p>
        <h1 className="text-3xl font-bold">{title}</h1>
        <p className="text-sm text-ink-soft">Printed {printedAt}.</p>
      </header>
      {children}
    </main>
  );
}

/** The mark a record not yet signed off carries on paper. */
export function SignOffMark({ signedOff }: { signedOff: boolean }) {
  return signedOff ? (
    <span className="whitespace-nowrap text-xs">signed off</span>
  ) : (
    <strong className="printed-unsigned whitespace-nowrap text-xs">NOT SIGNED OFF</strong>
  );
}

/**
 * The count that opens a printed register: how many records and how many of them not yet signed off, then
 * `note` (the sentence goes on) or a full stop.
 */
export function PrintedTally({
  rows,
  noun,
  note,
}: {
  rows: readonly { signedOff: boolean }[];
  noun: string;
  note?: ReactNode;
}) {
  const unsigned = rows.filter((r) => !r.signedOff).length;
  return (
    <p>
      <span className="num">{rows.length}</span> {noun};{" "}
      <strong data-unsigned={unsigned}>
        <span className="num">{unsigned}</span> not signed off
      </strong>
      {note ? <> {note}</> : "."}
    </p>
  );
}
