"use client";

import { useActionState } from "react";
import { AccountField, AccountSubmit } from "@/components/account/account-field";
import { signInAction, type SignInState } from "./actions";

export function SignInForm({ next }: { next?: string }) {
  const [state, action, pending] = useActionState<SignInState, FormData>(signInAction, {});
  return (
    <form action={action} className="mt-6 space-y-4" noValidate>
      <input type="hidden" name="next" value={next ?? ""} />
      <AccountField name="email" label="E-mail" errors={state.fieldErrors} type="email" autoComplete="username" />
      <AccountField
        name="password"
        label="Password"
        errors={state.fieldErrors}
        type="password"
        autoComplete="current-password"
      />
      <AccountSubmit error={state.error} pending={pending} busy="Checking…">
        Sign in
      </AccountSubmit>
    </form>
  );
}
