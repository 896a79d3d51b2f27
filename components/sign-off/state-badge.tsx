import type { Context } from "@/db/schema";

const look: Record<Context["state"], { label: string; cls: string }> = {
  open: { label: "Open", cls: "border-ink/30 bg-paper text-ink" },
  awaiting: { label: "Awaiting sign-off", cls: "border-accent bg-accent-light text-accent-dark" },
  signed_off: { label: "Signed off", cls: "border-ok bg-ok-light text-ok" },
};

/** A context's record state in words and colour (never colour alone). */
export function StateBadge({ state }: { state: Context["state"] }) {
  const l = look[state];
  return <span className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold uppercase tracking-wide ${l.cls}`}>{l.label}</span>;
}
