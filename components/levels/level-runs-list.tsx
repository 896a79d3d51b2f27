import type { LevelBookData } from "@/lib/server/reads/level-book";

type Run = LevelBookData["runs"][number];

const rl = (v: number | null) => (v === null ? "" : v.toFixed(3));
const mm = (v: number) => `${v >= 0 ? "+" : "−"}${Math.abs(v * 1000).toFixed(0)} mm`;
const reading = (v: number | null) => (v === null ? "" : v.toFixed(3));

function closure(run: Run) {
  if (run.misclosure === null) return <span className="text-ink-soft">not closed on a benchmark</span>;
  return run.withinTolerance ? (
    <span className="text-ok">
      {mm(run.misclosure)}, within ±{(run.tolerance * 1000).toFixed(0)} mm
    </span>
  ) : (
    <strong className="text-warn">
      {mm(run.misclosure)}, OUTSIDE ±{(run.tolerance * 1000).toFixed(0)} mm: levels flagged
    </strong>
  );
}

/** Every levelling run of the site as booked, with the reduced level each line gave. Prints whole. */
export function LevelRunsList({ runs }: { runs: Run[] }) {
  if (runs.length === 0) return <p className="text-ink-soft">No levelling runs booked yet.</p>;
  return (
    <div className="space-y-4">
      {runs.map((run) => (
        <article
          key={run.id}
          className="sheet report-sheet"
          aria-label={`Run of ${run.takenOn} from ${run.startCode}`}
          data-run={run.id}
        >
          <h3 className="font-bold">
            <span className="num">{run.takenOn}</span> · {run.startCode} → {run.closingCode ?? "open"}
            {run.trenchCode && <> · trench {run.trenchCode}</>}
          </h3>
          <p className="text-sm">
            Closing error: {closure(run)} · booked by {run.recordedBy ?? "—"}
          </p>
          <div className="overflow-x-auto">
            <table className="ledger mt-2 text-sm">
              <thead>
                <tr>
                  <th className="num">Line</th>
                  <th>Station</th>
                  <th className="num">BS</th>
                  <th className="num">IS</th>
                  <th className="num">FS</th>
                  <th className="num">RL (m)</th>
                </tr>
              </thead>
              <tbody>
                {run.lines.map((l, i) => (
                  <tr key={i}>
                    <td className="num">{i + 1}</td>
                    <td>{l.station}</td>
                    <td className="num">{reading(l.backsight)}</td>
                    <td className="num">{reading(l.intermediate)}</td>
                    <td className="num">{reading(l.foresight)}</td>
                    <td className="num font-bold">
                      {rl(l.level)}
                      {l.flagged && (
                        <span className="text-warn" title="From a run that closed outside tolerance">
                          {" "}
                          ⚑
                        </span>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </article>
      ))}
    </div>
  );
}
