import type { Context } from "@/db/schema";

/** The same stamp form as the server's refusals ("2026-07-14 09:30 UTC"). */
const formatStamp = (d: Date | null) => (d ? d.toISOString().slice(0, 16).replace("T", " ") + " UTC" : "an earlier date");

/**
 * Shown on a context's sheet, plan and finds when they cannot be changed, saying who holds them and until
 * when. The server refuses the writes regardless; this tells people before they try.
 */
export function LockNotice({ context, submittedBy, signedOffBy }: { context: Pick<Context, "number" | "state" | "submittedAt" | "signedOffAt">; submittedBy?: string | null; signedOffBy?: string | null }) {
  if (context.state === "open") return null;
  const signed = context.state === "signed_off";
  return (
    <p role="status" className={`rounded border-l-4 px-3 py-2 ${signed ? "border-ok bg-ok-light" : "border-accent bg-accent-light"}`}>
      {signed ? (
        <>Context {context.number} was <strong>signed off by {signedOffBy ?? "a director"}</strong> on <span className="num">{formatStamp(context.signedOffAt)}</span>. Its sheet, finds and relations are locked until a director reopens it with a reason.</>
      ) : (
        <>Context {context.number} was <strong>submitted for sign-off by {submittedBy ?? "a recorder"}</strong> on <span className="num">{formatStamp(context.submittedAt)}</span>. It is frozen until a director signs it off or returns it.</>
      )}
    </p>
  );
}
