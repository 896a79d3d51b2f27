import type { InputHTMLAttributes, ReactNode } from "react";
import { FormField } from "@/components/contexts/form-field";

/**
 * One input of the account forms (sign in, password reset, invitation): required, labelled, described by
 * the error its server action returns under the same name.
 */
export function AccountField({
  name,
  label,
  errors,
  ...input
}: { name: string; label: string; errors?: Record<string, string[] | undefined> } & Omit<
  InputHTMLAttributes<HTMLInputElement>,
  "id" | "name" | "className"
>) {
  return (
    <FormField id={name} label={label} error={errors?.[name]?.join(" ")}>
      <input className="field" id={name} name={name} required aria-describedby={`${name}-error`} {...input} />
    </FormField>
  );
}

/** The form's own refusal, announced at once, and its submit button, which names what it is doing. */
export function AccountSubmit({
  error,
  pending,
  busy,
  children,
}: {
  error?: string;
  pending: boolean;
  busy: string;
  children: ReactNode;
}) {
  return (
    <>
      <p className="field-error" role="alert" aria-live="assertive">
        {error}
      </p>
      <button className="btn-primary w-full" type="submit" disabled={pending}>
        {pending ? busy : children}
      </button>
    </>
  );
}
