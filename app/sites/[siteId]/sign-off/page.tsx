import Link from "next/link";
import type { Metadata } from "next";
import { SiteNav } from "@/components/site-nav";
import { SignOffNoticeProvider } from "@/components/sign-off/sign-off-notice";
import { SignOffActions } from "@/components/sign-off/sign-off-actions";
import { PackagePanel } from "@/components/archive/package-panel";
import { StateBadge } from "@/components/contexts/state-badge";
import { pageSiteActor } from "@/lib/server/page-access";
import { requestLocale } from "@/lib/server/request-locale";
import { formatWhen } from "@/lib/words/when";

export const metadata: Metadata = { title: "Sign-off" };

export default async function SignOffPage({ params }: { params: Promise<{ siteId: string }> }) {
  const locale = await requestLocale();
  const stamp = (d: Date | null) => (d ? formatWhen(d, locale) : "—");
  const { siteId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const queue = await read.signOffQueue();
  const director = actor.role === "director";
  const groups = [
    {
      key: "awaiting",
      title: director ? "Awaiting your sign-off" : "Awaiting sign-off",
      rows: queue.contexts.filter((c) => c.state === "awaiting"),
    },
    { key: "open", title: "Open sheets", rows: queue.contexts.filter((c) => c.state === "open") },
    { key: "signed_off", title: "Signed off", rows: queue.contexts.filter((c) => c.state === "signed_off") },
  ];
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/sign-off`} />
      <main className="mx-auto max-w-7xl space-y-6 px-4 py-6">
        <div>
          <h1 className="text-3xl font-bold">Sign-off</h1>
          <p className="mt-1 max-w-3xl text-ink-soft">
            {director
              ? "Sign off submitted sheets, or return or reopen them with a reason. A trench is signed off when all its contexts are."
              : actor.role === "digger"
                ? "Submit a complete sheet for sign-off; it is frozen until a director signs it off or returns it."
                : "Read-only for your role: the state of every context sheet."}
          </p>
        </div>
        <section aria-labelledby="trenches-h" className="sheet">
          <h2 id="trenches-h" className="text-lg font-bold">
            Trenches
          </h2>
          <ul className="mt-2 flex flex-wrap gap-3">
            {queue.trenches.map((t) => {
              const cs = queue.contexts.filter((c) => c.trenchId === t.id);
              const done = cs.filter((c) => c.state === "signed_off").length;
              return (
                <li key={t.id} className="rounded border border-paper-edge px-3 py-2">
                  <p className="font-bold">Trench {t.code}</p>
                  <p className="text-sm">
                    <span className="num">
                      {done}/{cs.length}
                    </span>{" "}
                    contexts signed off
                  </p>
                  {t.signedOffAt ? (
                    <p className="text-sm font-semibold text-ok">
                      Signed off by {t.signedOffBy} · <span className="num">{stamp(t.signedOffAt)}</span>
                    </p>
                  ) : (
                    <p className="text-sm text-ink-soft">Not signed off</p>
                  )}
                  <Link
                    className="mt-1 inline-flex min-h-11 items-center underline"
                    href={`/sites/${siteId}/reports/${t.id}`}
                  >
                    Trench record report
                  </Link>
                </li>
              );
            })}
          </ul>
        </section>
        {director && (
          <section aria-labelledby="package-h" className="sheet">
            <h2 id="package-h" className="text-lg font-bold">
              Deposition package
            </h2>
            <p className="mt-1 max-w-3xl text-sm text-ink-soft">
              The archive for a repository: a BagIt bag in one zip with every register as CSV, the matrix, the photos
              and the analysis runs, each file with its SHA-256. Records not yet signed off are marked so in every
              register. A package of one trench waits for its sign-off. The package is written on the server (it goes on
              if you leave this page); its fingerprint, the SHA-256 of its manifest, is stated in bag-info.txt and shown
              here once it is written.
            </p>
            <PackagePanel
              siteId={siteId}
              signedOffTrenches={queue.trenches.filter((t) => t.signedOffAt).map((t) => ({ id: t.id, code: t.code }))}
            />
          </section>
        )}
        <SignOffNoticeProvider>
          {groups.map((g) => (
            <section key={g.key} aria-labelledby={`${g.key}-h`}>
              <h2 id={`${g.key}-h`} className="text-xl font-bold">
                {g.title} <span className="num text-base text-ink-soft">({g.rows.length})</span>
              </h2>
              {g.rows.length === 0 ? (
                <p className="mt-1 text-ink-soft">None.</p>
              ) : (
                <div className="overflow-x-auto">
                  <table className="ledger mt-2">
                    <thead>
                      <tr>
                        <th>Context</th>
                        <th>Trench</th>
                        <th>State</th>
                        <th className="num">Finds</th>
                        <th>Submitted</th>
                        <th>Signed off</th>
                        <th>Sheet check</th>
                        <th>Actions</th>
                      </tr>
                    </thead>
                    <tbody>
                      {g.rows.map((c) => (
                        <tr key={c.id} data-context={c.number}>
                          <td>
                            <Link className="num font-semibold underline" href={`/sites/${siteId}/contexts/${c.id}`}>
                              {c.number}
                            </Link>{" "}
                            <span className="text-ink-soft">{c.type}</span>
                          </td>
                          <td>{c.trenchCode}</td>
                          <td>
                            <StateBadge state={c.state} />
                          </td>
                          <td className="num">{c.finds}</td>
                          <td className="text-xs">
                            {c.submittedBy ? (
                              <>
                                {c.submittedBy}
                                <br />
                                <span className="num">{stamp(c.submittedAt)}</span>
                              </>
                            ) : (
                              "—"
                            )}
                          </td>
                          <td className="text-xs">
                            {c.signedOffBy ? (
                              <>
                                {c.signedOffBy}
                                <br />
                                <span className="num">{stamp(c.signedOffAt)}</span>
                              </>
                            ) : (
                              "—"
                            )}
                          </td>
                          <td className="max-w-xs text-xs">
                            {c.state === "signed_off" ? (
                              "Locked"
                            ) : c.problems.length === 0 ? (
                              <span className="font-semibold text-ok">Complete</span>
                            ) : (
                              <ul className="list-disc pl-4 text-warn">
                                {c.problems.map((p, i) => (
                                  <li key={i}>{p.message}</li>
                                ))}
                              </ul>
                            )}
                          </td>
                          <td>
                            <SignOffActions
                              siteId={siteId}
                              contextId={c.id}
                              number={c.number}
                              state={c.state}
                              role={actor.role}
                              ready={c.problems.length === 0}
                            />
                          </td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                </div>
              )}
            </section>
          ))}
        </SignOffNoticeProvider>
        <p>
          <Link className="underline" href={`/sites/${siteId}/audit`}>
            Record trail of the whole site
          </Link>
        </p>
      </main>
    </>
  );
}
