"use client";

import { useActionState } from "react";
import { AccountField, AccountSubmit } from "@/components/account/account-field";
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
      <AccountField
        name="email"
        label="E-mail of your account"
        errors={state.fieldErrors}
        type="email"
        autoComplete="username"
      />
      <AccountSubmit error={state.error} pending={pending} busy="Sending…">
        Send me a reset link
      </AccountSubmit>
    </form>
  );
}
