/** Each record state in words, with the badge colours that go with it (colour never stands alone). */
export const stateWords: Record<string, { text: string; cls: string }> = {
  open: { text: "open", cls: "border-ink/30 text-ink-soft" },
  awaiting: { text: "awaiting sign-off", cls: "border-accent text-accent-dark bg-accent-light" },
  signed_off: { text: "signed off", cls: "border-ok text-ok bg-ok-light" },
};

/** A record state in words, never in colour alone. */
export function StateBadge({ state }: { state: string }) {
  const w = stateWords[state] ?? stateWords.open;
  return <span className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold ${w.cls}`}>{w.text}</span>;
}
