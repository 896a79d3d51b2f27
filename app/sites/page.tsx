import type { Metadata } from "next";
import Link from "next/link";
import { AppHeader } from "@/components/app-header";
import { NewSiteForm } from "@/components/sites/new-site-form";
import { pageUser } from "@/lib/server/page-access";

export const metadata: Metadata = { title: "Your sites" };

const roleNote = {
  digger: "You record on this site",
  specialist: "You study the finds",
  director: "You answer for the record",
} as const;

export default async function SitesPage() {
  const { user, read } = await pageUser();
  const mine = await read.mySites();
  return (
    <>
      <AppHeader userName={user.name} device={{ userId: user.id }} />
      <main className="mx-auto max-w-5xl px-4 py-6">
        <h1 className="text-3xl font-bold">Your sites</h1>
        {mine.length === 0 && (
          <p className="mt-4 text-ink-soft">You are not on any site yet. A site director can add you.</p>
        )}
        <ul className="mt-6 grid gap-4 sm:grid-cols-2">
          {mine.map((s) => (
            <li key={s.id} className="sheet">
              <Link href={`/sites/${s.id}`} className="block">
                <p className="font-mono text-sm text-ink-faint">{s.code}</p>
                <h2 className="text-xl font-bold underline decoration-accent/40 underline-offset-4">{s.name}</h2>
                <p className="mt-1 text-sm">
                  <span className="font-semibold">{s.role}</span> — {roleNote[s.role]}
                </p>
                <dl className="mt-3 grid grid-cols-2 gap-1 text-sm">
                  <dt className="text-ink-soft">Trenches</dt>
                  <dd className="num">{s.trenches}</dd>
                  <dt className="text-ink-soft">Finds</dt>
                  <dd className="num">{s.finds}</dd>
                  <dt className="text-ink-soft">Awaiting sign-off</dt>
                  <dd className="num">{s.awaitingSignOff}</dd>
                  <dt className="text-ink-soft">Finished analyses</dt>
                  <dd className="num">{s.runsDone}</dd>
                </dl>
              </Link>
            </li>
          ))}
        </ul>
        <div className="mt-8">
          <NewSiteForm />
        </div>
      </main>
    </>
  );
}
