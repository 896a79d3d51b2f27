import { SpitForm } from "./spit-form";

type Spit = { id: string; number: number; topLevel: number | null; baseLevel: number | null };
type Spot = { id: string; target: string; level: number; flagged: boolean; station: string };

const rl = (v: number | null) => (v === null ? "—" : v.toFixed(3));

/**
 * A context's levels: spot levels on its top and base (from levelling runs) and its spits. Every figure is a
 * reduced level in metres against the site's datum, named here as the site names it.
 */
export function LevelsPanel({
  siteId,
  contextId,
  datumName,
  spits,
  spots,
  canEdit,
}: {
  siteId: string;
  contextId: string;
  datumName: string;
  spits: Spit[];
  spots: Spot[];
  canEdit: boolean;
}) {
  const tops = spots.filter((s) => s.target === "context_top");
  const bases = spots.filter((s) => s.target === "context_base");
  const list = (items: Spot[]) =>
    items.length === 0 ? (
      <span className="text-ink-soft">none taken</span>
    ) : (
      items.map((s) => (
        <span key={s.id} className="num mr-3">
          {rl(s.level)}
          {s.flagged && (
            <span className="text-warn" title="From a levelling run that closed outside the site's tolerance">
              {" "}
              (run outside tolerance)
            </span>
          )}
        </span>
      ))
    );
  return (
    <section aria-labelledby="levels-h" className="sheet space-y-2">
      <h2 id="levels-h" className="text-lg font-bold">
        Levels
      </h2>
      <p className="text-sm text-ink-soft">Reduced levels in metres against {datumName}.</p>
      <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-[10rem_1fr]">
        <dt className="font-semibold text-ink-soft">Top (spot levels)</dt>
        <dd>{list(tops)}</dd>
        <dt className="font-semibold text-ink-soft">Base (spot levels)</dt>
        <dd>{list(bases)}</dd>
      </dl>
      <table className="text-sm" aria-label="Spits">
        <thead>
          <tr>
            <th className="pr-4 text-left">Spit</th>
            <th className="pr-4 text-right">Top RL (m)</th>
            <th className="text-right">Base RL (m)</th>
          </tr>
        </thead>
        <tbody>
          {spits.length === 0 && (
            <tr>
              <td colSpan={3} className="text-ink-soft">
                Not dug in spits.
              </td>
            </tr>
          )}
          {spits.map((s) => (
            <tr key={s.id}>
              <td className="num pr-4">{s.number}</td>
              <td className="num pr-4 text-right">{rl(s.topLevel)}</td>
              <td className="num text-right">{rl(s.baseLevel)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {canEdit && <SpitForm siteId={siteId} contextId={contextId} nextNumber={(spits.at(-1)?.number ?? 0) + 1} />}
    </section>
  );
}
