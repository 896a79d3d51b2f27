import type { Metadata } from "next";
import { RequestForm } from "./request-form";

export const metadata: Metadata = { title: "Reset password" };

export default function ResetPasswordPage() {
  return (
    <main className="mx-auto mt-16 max-w-md px-4">
      <div className="sheet">
        <p className="font-mono text-xs uppercase tracking-widest text-ink-faint">Loamwork</p>
        <h1 className="mt-1 text-3xl font-bold">Forgotten your password?</h1>
        <p className="mt-2 text-ink-soft">We will e-mail you a link to choose a new one.</p>
        <RequestForm />
      </div>
    </main>
  );
}
