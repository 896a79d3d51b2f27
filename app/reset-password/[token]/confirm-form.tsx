"use client";

import Link from "next/link";
import { useActionState } from "react";
import { confirmResetAction, type ResetState } from "../actions";

export function ConfirmForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState<ResetState, FormData>(confirmResetAction, {});
  if (state.done)
    return (
      <p className="mt-6" role="status">
        Your password is changed.{" "}
        <Link className="underline" href="/sign-in">
          Sign in
        </Link>{" "}
        with it now.
      </p>
    );
  return (
    <form action={action} className="mt-6 space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <div>
        <label className="label" htmlFor="password">
          New password (at least 10 characters)
        </label>
        <input
          className="field"
          id="password"
          name="password"
          type="password"
          autoComplete="new-password"
          required
          aria-describedby="password-error"
        />
        <p id="password-error" className="field-error" aria-live="polite">
          {state.fieldErrors?.password?.join(" ")}
        </p>
      </div>
      <div>
        <label className="label" htmlFor="again">
          The same again
        </label>
        <input
          className="field"
          id="again"
          name="again"
          type="password"
          autoComplete="new-password"
          required
          aria-describedby="again-error"
        />
        <p id="again-error" className="field-error" aria-live="polite">
          {state.fieldErrors?.again?.join(" ")}
        </p>
      </div>
      <p className="field-error" role="alert" aria-live="assertive">
        {state.error}
      </p>
      <button className="btn-primary w-full" type="submit" disabled={pending}>
        {pending ? "Saving…" : "Save the new password"}
      </button>
    </form>
  );
}
