import Link from "next/link";
import { SiteNav } from "@/components/site-nav";
import { pageSiteActor } from "@/lib/server/page-access";

export default async function ReportsPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const { trenches } = await read.overview();
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current="" />
      <main className="mx-auto max-w-5xl space-y-4 px-4 py-6">
        <h1 className="text-3xl font-bold">Trench records</h1>
        <p className="text-ink-soft">
          A printable record of each trench: plan, context sheets, matrix, finds register and saved analyses, stamped
          with its sign-off.
        </p>
        <p>
          <Link className="inline-flex min-h-11 items-center font-bold underline" href={`/sites/${siteId}/numbers`}>
            Number accounting
          </Link>{" "}
          <span className="text-sm text-ink-soft">
            every find and context number: recorded, reserved on a device, void with the reason, or not handed out
          </span>
        </p>
        <ul className="space-y-2">
          {trenches.map((t) => (
            <li key={t.id}>
              <Link
                className="inline-flex min-h-11 items-center text-lg font-bold underline"
                href={`/sites/${siteId}/reports/${t.id}`}
              >
                Trench {t.code}
              </Link>{" "}
              <span className="text-sm text-ink-soft">
                {t.contexts} contexts · {t.finds} finds · {t.signedOffAt ? "signed off" : "not signed off"}
              </span>
            </li>
          ))}
        </ul>
      </main>
    </>
  );
}
