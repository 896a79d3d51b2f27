"use client";

/**
 * A message over the plan: what was just saved, or why something was refused; dismissed by its button.
 * Its words are in ink, at the plan's 7:1 (tests/unit/plan-contrast.test.ts); the border carries the tone.
 */
export function PlanMessage({
  message,
  onDismiss,
}: {
  message: { kind: "ok" | "warn"; text: string };
  onDismiss: () => void;
}) {
  return (
    <div
      role={message.kind === "warn" ? "alert" : "status"}
      className={`absolute left-1/2 top-3 z-10 flex max-w-[90%] -translate-x-1/2 items-center gap-3 rounded border-2 px-3 py-1 font-semibold shadow text-ink ${message.kind === "warn" ? "border-warn bg-warn-light" : "border-ok bg-ok-light"}`}
      data-testid="plan-message"
    >
      <span>{message.text}</span>
      <button type="button" className="btn min-h-11 px-2" onClick={onDismiss} aria-label="Dismiss message">
        ✕
      </button>
    </div>
  );
}
