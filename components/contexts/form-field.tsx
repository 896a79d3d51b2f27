import type { ComponentProps, ReactNode } from "react";

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

/**
 * A labelled input with its error line, which describes it: the input's own props pass through, among them
 * react-hook-form's registration of the field (its ref too).
 */
export function InputField({
  id,
  label,
  error,
  className = "field",
  ...input
}: { id: string; label: string; error?: string } & Omit<ComponentProps<"input">, "id">) {
  return (
    <FormField id={id} label={label} error={error}>
      <input id={id} className={className} aria-describedby={`${id}-error`} {...input} />
    </FormField>
  );
}

/** A labelled number input (figures aligned): the decimal keypad, or the whole-number one when `whole`. */
export function NumberField({ whole = false, ...field }: { whole?: boolean } & ComponentProps<typeof InputField>) {
  return <InputField className="field num" inputMode={whole ? "numeric" : "decimal"} {...field} />;
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
