import path from "node:path";
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { env } from "@/lib/env";
import { readSinkMessages } from "@/lib/server/mail/sink-reader";
import { pageUser } from "@/lib/server/page-access";

export const metadata: Metadata = { title: "Caught mail (development)" };
export const dynamic = "force-dynamic";

/**
 * Development only: the messages the local SMTP sink caught (MAIL_SINK_DIR). A production build answers 404
 * unless LOAMWORK_DEV_MAIL=1 (the demo and the browser tests), because mail holds sign-in links; and even
 * then only people signed in to the demo see it, never a passer-by.
 */
export default async function DevMailPage({ searchParams }: { searchParams: Promise<{ to?: string }> }) {
  const e = env();
  if (e.NODE_ENV === "production" && e.LOAMWORK_DEV_MAIL !== "1") notFound();
  await pageUser();
  const { to } = await searchParams;
  const all = readSinkMessages(path.resolve(e.MAIL_SINK_DIR));
  const shown = to ? all.filter((m) => m.envelope.to.some((a) => a.toLowerCase() === to.toLowerCase())) : all;
  return (
    <main className="mx-auto max-w-5xl space-y-4 px-4 py-6">
      <p className="font-mono text-xs uppercase tracking-widest text-warn">Development only</p>
      <h1 className="text-3xl font-bold">Caught mail</h1>
      <p className="text-ink-soft">
        Every message Loamwork sent to the local SMTP sink, newest first. Nothing here left this machine.
      </p>
      <form method="get" className="flex items-end gap-2">
        <div>
          <label className="label" htmlFor="to">
            Only to
          </label>
          <input id="to" name="to" className="field" defaultValue={to ?? ""} type="email" />
        </div>
        <button className="btn" type="submit">
          Filter
        </button>
      </form>
      {shown.length === 0 && <p>No mail yet.</p>}
      <ol className="space-y-3">
        {shown.map((m) => (
          <li key={m.id} className="sheet" data-mail-to={m.envelope.to.join(",")}>
            <p className="font-bold">{m.subject}</p>
            <p className="text-sm text-ink-soft">
              <span className="num">{m.receivedAt.slice(0, 19).replace("T", " ")}</span> · from {m.from.join(", ")} · to{" "}
              {m.envelope.to.join(", ")}
            </p>
            <details className="mt-2" open={shown.length === 1}>
              <summary className="cursor-pointer">Plain text</summary>
              <pre className="mt-1 whitespace-pre-wrap font-mono text-xs">{m.text}</pre>
            </details>
            {m.html && (
              <details className="mt-2">
                <summary className="cursor-pointer">HTML</summary>
                <iframe
                  title={`HTML of ${m.subject}`}
                  sandbox=""
                  srcDoc={m.html}
                  className="mt-1 h-72 w-full border border-paper-edge bg-white"
                />
              </details>
            )}
          </li>
        ))}
      </ol>
    </main>
  );
}
