"use client";

import { useActionState } from "react";
import { acceptAction, type AcceptState } from "./actions";

export function AcceptForm({ token, email, hasAccount }: { token: string; email: string; hasAccount: boolean }) {
  const [state, action, pending] = useActionState<AcceptState, FormData>(acceptAction, {});
  return (
    <form action={action} className="mt-6 space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <p>
        E-mail: <span className="font-mono">{email}</span>
      </p>
      {!hasAccount && (
        <div>
          <label className="label" htmlFor="name">
            Your name, as it should appear on the record
          </label>
          <input className="field" id="name" name="name" autoComplete="name" required aria-describedby="name-error" />
          <p id="name-error" className="field-error" aria-live="polite">
            {state.fieldErrors?.name?.join(" ")}
          </p>
        </div>
      )}
      <div>
        <label className="label" htmlFor="password">
          {hasAccount ? "The password of your Loamwork account" : "Choose a password (at least 10 characters)"}
        </label>
        <input
          className="field"
          id="password"
          name="password"
          type="password"
          autoComplete={hasAccount ? "current-password" : "new-password"}
          required
          aria-describedby="password-error"
        />
        <p id="password-error" className="field-error" aria-live="polite">
          {state.fieldErrors?.password?.join(" ")}
        </p>
      </div>
      <p className="field-error" role="alert" aria-live="assertive">
        {state.error}
      </p>
      <button className="btn-primary w-full" type="submit" disabled={pending}>
        {pending ? "Joining…" : "Join the site"}
      </button>
    </form>
  );
}
