import type { ReactNode } from "react";

/** A labelled field with its error beside it, announced to screen readers as it appears (aria-live). */
export function FormField({
  id,
  label,
  error,
  hint,
  children,
}: {
  id: string;
  label: string;
  error?: string;
  hint?: string;
  children: ReactNode;
}) {
  return (
    <div>
      <label className="label" htmlFor={id}>
        {label}
      </label>
      {children}
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-faint">
          {hint}
        </p>
      )}
      <p id={`${id}-error`} className="field-error" aria-live="polite">
        {error ?? ""}
      </p>
    </div>
  );
}

/** Server field errors (zod's flattened paths) onto react-hook-form's setError. */
export function applyFieldErrors(
  fieldErrors: Record<string, string[]> | undefined,
  setError: (name: never, e: { message: string }) => void,
): boolean {
  if (!fieldErrors) return false;
  let any = false;
  for (const [name, messages] of Object.entries(fieldErrors)) {
    if (name === "_") continue;
    setError(name as never, { message: messages.join(" ") });
    any = true;
  }
  return any;
}
