"use client";

import { useActionState } from "react";
import { requestResetAction, type ResetState } from "./actions";

export function RequestForm() {
  const [state, action, pending] = useActionState<ResetState, FormData>(requestResetAction, {});
  if (state.done)
    return (
      <p className="mt-6" role="status">
        If an account uses that address, a message with a link is on its way. The link works for an hour.
      </p>
    );
  return (
    <form action={action} className="mt-6 space-y-4" noValidate>
      <div>
        <label className="label" htmlFor="email">
          E-mail of your account
        </label>
        <input
          className="field"
          id="email"
          name="email"
          type="email"
          autoComplete="username"
          required
          aria-describedby="email-error"
        />
        <p id="email-error" className="field-error" aria-live="polite">
          {state.fieldErrors?.email?.join(" ")}
        </p>
      </div>
      <p className="field-error" role="alert" aria-live="assertive">
        {state.error}
      </p>
      <button className="btn-primary w-full" type="submit" disabled={pending}>
        {pending ? "Sending…" : "Send me a reset link"}
      </button>
    </form>
  );
}
