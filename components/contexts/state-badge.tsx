/** Each record state in words, with the badge colours that go with it (colour never stands alone). */
type StateWords = { text: string; cls: string };

/** The three states always have words; any other string may not (a state added on the server later). */
export const stateWords: Record<string, StateWords | undefined> &
  Record<"open" | "awaiting" | "signed_off", StateWords> = {
  open: { text: "open", cls: "border-ink/30 text-ink-soft" },
  awaiting: { text: "awaiting sign-off", cls: "border-accent text-accent-dark bg-accent-light" },
  signed_off: { text: "signed off", cls: "border-ok text-ok bg-ok-light" },
};

/** A record state in words, never in colour alone. */
export function StateBadge({ state }: { state: string }) {
  const w = stateWords[state] ?? stateWords.open;
  return <span className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold ${w.cls}`}>{w.text}</span>;
}
