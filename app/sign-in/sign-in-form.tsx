"use client";

import { useActionState } from "react";
import { signInAction, type SignInState } from "./actions";

export function SignInForm({ next }: { next?: string }) {
  const [state, action, pending] = useActionState<SignInState, FormData>(signInAction, {});
  return (
    <form action={action} className="mt-6 space-y-4" noValidate>
      <input type="hidden" name="next" value={next ?? ""} />
      <div>
        <label className="label" htmlFor="email">
          E-mail
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
      <div>
        <label className="label" htmlFor="password">
          Password
        </label>
        <input
          className="field"
          id="password"
          name="password"
          type="password"
          autoComplete="current-password"
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
        {pending ? "Checking…" : "Sign in"}
      </button>
    </form>
  );
}
