"use client";

import Link from "next/link";
import { useActionState } from "react";
import { AccountField, AccountSubmit } from "@/components/account/account-field";
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
      <AccountField
        name="password"
        label="New password (at least 10 characters)"
        errors={state.fieldErrors}
        type="password"
        autoComplete="new-password"
      />
      <AccountField
        name="again"
        label="The same again"
        errors={state.fieldErrors}
        type="password"
        autoComplete="new-password"
      />
      <AccountSubmit error={state.error} pending={pending} busy="Saving…">
        Save the new password
      </AccountSubmit>
    </form>
  );
}
