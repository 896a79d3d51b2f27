import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { BoxDelete } from "@/components/boxes/box-delete";
import { BoxEmpty } from "@/components/boxes/box-empty";
import { BoxForm } from "@/components/boxes/box-form";
import { SiteNav } from "@/components/site-nav";
import { isPublicError } from "@/lib/server/errors";
import { pageSiteActor } from "@/lib/server/page-access";
import { findProcessingLabels } from "@/lib/schemas/processing";
import { sampleStatusLabels } from "@/lib/schemas/sample";

export const metadata: Metadata = { title: "Box" };

/** One box: where it is kept and what it holds, with its label to print. */
export default async function BoxPage({ params }: { params: Promise<{ siteId: string; boxId: string }> }) {
  const { siteId, boxId } = await params;
  const { actor, read } = await pageSiteActor(siteId);
  const [box, choices] = await Promise.all([
    read.box(boxId).catch((err) => {
      if (isPublicError(err) && err.status === 404) notFound();
      throw err;
    }),
    read.boxChoices(),
  ]);
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/boxes`} />
      <main className="mx-auto max-w-4xl space-y-4 px-4 py-6">
        <p>
          <Link className="underline" href={`/sites/${siteId}/boxes`}>
            ← Box register
          </Link>
        </p>
        <div className="flex flex-wrap items-baseline gap-3">
          <h1 className="text-3xl font-bold">
            Box <span className="num">{box.number}</span>
          </h1>
          <span className="text-xl text-ink-soft">{box.store || "store not given"}</span>
          <Link className="btn ml-auto" href={`/sites/${siteId}/labels?kind=boxes&ids=${box.id}&preset=8`}>
            Print the box label
          </Link>
        </div>
        <BoxForm siteId={siteId} box={{ id: box.id, number: box.number, store: box.store, note: box.note }} />
        <section className="space-y-2" aria-labelledby="box-finds">
          <h2 id="box-finds" className="text-xl font-semibold">
            Finds in the box ({box.finds.length})
          </h2>
          {box.finds.length === 0 ? (
            <p className="text-ink-soft">None.</p>
          ) : (
            <table className="ledger sheet" aria-label={`Finds in box ${box.number}`}>
              <thead>
                <tr>
                  <th className="num">Find</th>
                  <th>Class</th>
                  <th>Trench</th>
                  <th className="num">Context</th>
                  <th>Processing</th>
                </tr>
              </thead>
              <tbody>
                {box.finds.map((f) => (
                  <tr key={f.id}>
                    <td className="num font-semibold">
                      <Link className="underline" href={`/sites/${siteId}/finds/${f.id}`}>
                        {f.number}
                      </Link>
                    </td>
                    <td>
                      {f.classCode} · {f.classLabel}
                    </td>
                    <td>{f.trenchCode}</td>
                    <td className="num">{f.contextNumber}</td>
                    <td>{findProcessingLabels[f.processing]}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
        <section className="space-y-2" aria-labelledby="box-samples">
          <h2 id="box-samples" className="text-xl font-semibold">
            Samples in the box ({box.samples.length})
          </h2>
          {box.samples.length === 0 ? (
            <p className="text-ink-soft">None.</p>
          ) : (
            <table className="ledger sheet" aria-label={`Samples in box ${box.number}`}>
              <thead>
                <tr>
                  <th className="num">Sample</th>
                  <th>Type</th>
                  <th>Trench</th>
                  <th className="num">Context</th>
                  <th>Status</th>
                </tr>
              </thead>
              <tbody>
                {box.samples.map((s) => (
                  <tr key={s.id}>
                    <td className="num font-semibold">
                      <Link className="underline" href={`/sites/${siteId}/samples/${s.id}`}>
                        {s.number}
                      </Link>
                    </td>
                    <td>{s.typeLabel}</td>
                    <td>{s.trenchCode}</td>
                    <td className="num">{s.contextNumber}</td>
                    <td>{sampleStatusLabels[s.status]}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
        <BoxEmpty
          siteId={siteId}
          box={{ id: box.id, number: box.number }}
          holds={{ finds: box.finds.length, samples: box.samples.length }}
          others={choices.filter((b) => b.id !== box.id)}
        />
        <BoxDelete
          siteId={siteId}
          box={{ id: box.id, number: box.number }}
          holds={{ finds: box.finds.length, samples: box.samples.length }}
        />
      </main>
    </>
  );
}
