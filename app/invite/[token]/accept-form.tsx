"use client";

import { useActionState } from "react";
import { AccountField, AccountSubmit } from "@/components/account/account-field";
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
        <AccountField
          name="name"
          label="Your name, as it should appear on the record"
          errors={state.fieldErrors}
          autoComplete="name"
        />
      )}
      <AccountField
        name="password"
        label={hasAccount ? "The password of your Loamwork account" : "Choose a password (at least 10 characters)"}
        errors={state.fieldErrors}
        type="password"
        autoComplete={hasAccount ? "current-password" : "new-password"}
      />
      <AccountSubmit error={state.error} pending={pending} busy="Joining…">
        Join the site
      </AccountSubmit>
    </form>
  );
}
