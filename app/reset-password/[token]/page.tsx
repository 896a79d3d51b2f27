import type { Metadata } from "next";
import { ConfirmForm } from "./confirm-form";

export const metadata: Metadata = { title: "Choose a new password" };

export default async function ConfirmResetPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <main className="mx-auto mt-16 max-w-md px-4">
      <div className="sheet">
        <p className="font-mono text-xs uppercase tracking-widest text-ink-faint">Loamwork</p>
        <h1 className="mt-1 text-3xl font-bold">Choose a new password</h1>
        <ConfirmForm token={token} />
      </div>
    </main>
  );
}
