import Link from "next/link";
import type { Metadata } from "next";
import { invitationByToken } from "@/lib/server/reads/invitation";
import { AcceptForm } from "./accept-form";

export const metadata: Metadata = { title: "Invitation" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const inv = await invitationByToken(token);
  return (
    <main className="mx-auto mt-16 max-w-md px-4">
      <div className="sheet">
        <p className="font-mono text-xs uppercase tracking-widest text-ink-faint">Loamwork</p>
        {inv.status === "pending" ? (
          <>
            <h1 className="mt-1 text-3xl font-bold">
              Join {inv.site.code} {inv.site.name}
            </h1>
            <p className="mt-2 text-ink-soft">
              {inv.invitedBy} invites you as <strong>{inv.role}</strong>. The invitation expires on{" "}
              <span className="num">{inv.expiresAt.toISOString().slice(0, 16).replace("T", " ")} UTC</span>.
            </p>
            <AcceptForm token={token} email={inv.email} hasAccount={inv.hasAccount} />
          </>
        ) : (
          <>
            <h1 className="mt-1 text-3xl font-bold">This invitation cannot be used</h1>
            <p className="mt-2">
              {inv.status === "accepted"
                ? "It has already been accepted."
                : inv.status === "expired"
                  ? "It has expired."
                  : "The link is not one Loamwork sent, or it was withdrawn."}{" "}
              Ask the site director for a new invitation, or{" "}
              <Link className="underline" href="/sign-in">
                sign in
              </Link>
              .
            </p>
          </>
        )}
      </div>
    </main>
  );
}
