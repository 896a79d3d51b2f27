"use client";

import { useState } from "react";
import { ApiError, apiClient, keptOnDevice } from "@/lib/api/client";
import { readReading, reduceAsBooked } from "@/lib/levels/level-book";
import type { LevelBookRow } from "@/lib/levels/levelling";
import { levelRunCreateSchema, type levelTargets } from "@/lib/schemas/levels";
import { LineTarget, stationFor, type Choices } from "./line-target";

type Target = (typeof levelTargets)[number];
export type BookLine = {
  key: number;
  station: string;
  target: Target;
  ref: string;
  bs: string;
  is: string;
  fs: string;
};

const rl = (v: number | null | undefined) => (v === null || v === undefined ? "" : v.toFixed(3));
const today = () => new Date().toISOString().slice(0, 10);
let nextKey = 1;
const blankLine = (target: Target = "other", ref = ""): BookLine => ({
  key: nextKey++,
  station: "",
  target,
  ref,
  bs: "",
  is: "",
  fs: "",
});

/** A typed reading: blank is none; text that is not a number reaches the reducer as NaN, which names the line. */
const reading = (text: string) => {
  const v = readReading(text);
  return v === "bad" ? Number.NaN : v;
};

/**
 * The level book: a run booked line by line (backsight, intermediate sight, foresight), each reduced level
 * worked as it is typed, the closing error shown against the site's tolerance before the run is sent.
 */
export function LevelBookForm({
  siteId,
  tolerance,
  datumName,
  trenches,
  choices,
}: {
  siteId: string;
  tolerance: number;
  datumName: string;
  trenches: { id: string; code: string }[];
  choices: Choices;
}) {
  const [takenOn, setTakenOn] = useState(today);
  const [trenchId, setTrenchId] = useState("");
  const [startId, setStartId] = useState("");
  const [closingId, setClosingId] = useState("");
  const [lines, setLines] = useState<BookLine[]>(() => [
    blankLine("benchmark"),
    blankLine("find"),
    blankLine("benchmark"),
  ]);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState("");
  const [busy, setBusy] = useState(false);

  const start = choices.benchmarks.find((b) => b.id === startId) ?? null;
  const closing = choices.benchmarks.find((b) => b.id === closingId) ?? null;
  const rows: LevelBookRow[] = lines.map((l, i) => ({
    station: l.station || stationFor(l, choices) || `line ${i + 1}`,
    backsight: reading(l.bs),
    intermediate: reading(l.is),
    foresight: reading(l.fs),
  }));
  // A book is a few dozen lines: reduced afresh on every keystroke.
  const live = reduceAsBooked(start?.level ?? null, rows, closing?.level ?? null, tolerance);

  const change = (key: number, patch: Partial<BookLine>) =>
    setLines((all) => all.map((l) => (l.key === key ? { ...l, ...patch } : l)));
  const addLine = (at: number) => setLines((all) => [...all.slice(0, at + 1), blankLine(), ...all.slice(at + 1)]);
  const removeLine = (key: number) => setLines((all) => (all.length > 2 ? all.filter((l) => l.key !== key) : all));
  const pickStart = (id: string) => {
    setStartId(id);
    setLines((all) => all.map((l, i) => (i === 0 ? { ...l, target: "benchmark", ref: id } : l)));
  };
  const pickClosing = (id: string) => {
    setClosingId(id);
    if (id) setLines((all) => all.map((l, i) => (i === all.length - 1 ? { ...l, target: "benchmark", ref: id } : l)));
  };

  /** Find numbers become the finds' ids; a number not on this site is named on its line. */
  async function resolveFinds(): Promise<Record<number, string> | null> {
    const found: Record<number, string> = {};
    const problems: Record<string, string> = {};
    for (const [i, l] of lines.entries()) {
      if (l.target !== "find") continue;
      const n = Number(l.ref.trim());
      if (!Number.isInteger(n) || n < 1) {
        problems[`lines.${i}.targetId`] = "Give the find's number.";
        continue;
      }
      const page = await apiClient.call("findsList", { siteId }, { q: String(n), pageSize: 50 });
      const hit = page.rows.find((r) => r.number === n);
      if (hit) found[i] = hit.id;
      else problems[`lines.${i}.targetId`] = `Find ${n} is not on this site.`;
    }
    if (Object.keys(problems).length) {
      setErrors(problems);
      return null;
    }
    return found;
  }

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setErrors({});
    setMessage("");
    if (live.unfinished) {
      setMessage(live.unfinished);
      return;
    }
    setBusy(true);
    try {
      const findIds = await resolveFinds();
      if (!findIds) return;
      const body = {
        takenOn,
        trenchId: trenchId || null,
        startBenchmarkId: startId,
        closingBenchmarkId: closingId || null,
        lines: lines.map((l, i) => ({
          station: rows[i]!.station,
          target: l.target,
          targetId: l.target === "find" ? findIds[i] : l.ref || null,
          backsight: rows[i]!.backsight,
          intermediate: rows[i]!.intermediate,
          foresight: rows[i]!.foresight,
        })),
      };
      const parsed = levelRunCreateSchema.safeParse(body);
      if (!parsed.success) {
        setErrors(Object.fromEntries(parsed.error.issues.map((issue) => [issue.path.join("."), issue.message])));
        setMessage("The book has mistakes: see the lines marked.");
        return;
      }
      const answer = await apiClient.call("levelRunsCreate", { siteId }, body);
      setMessage(
        `${keptOnDevice(answer) ? "Run kept on this device, to be booked when it is back online" : "Run booked"}: ${lines.length} levels from ${start?.code}${live.misclosure === null ? ", not closed on a benchmark" : `, closing error ${(live.misclosure * 1000).toFixed(0)} mm`}.`,
      );
      setLines([blankLine("benchmark", startId), blankLine("find"), blankLine("benchmark", closingId)]);
    } catch (err) {
      if (err instanceof ApiError) {
        setErrors(Object.fromEntries(Object.entries(err.fieldErrors).map(([k, v]) => [k, v.join(" ")])));
        setMessage(err.message);
      } else setMessage(err instanceof Error ? err.message : String(err));
    } finally {
      setBusy(false);
    }
  }

  const lineError = (i: number) =>
    Object.entries(errors)
      .filter(([k]) => k.startsWith(`lines.${i}.`))
      .map(([, v]) => v)
      .join(" ") ||
    live.lines[i]?.problem ||
    "";
  const closure =
    live.misclosure === null
      ? closing
        ? "The closing error shows once the book ends on a foresight on the closing benchmark."
        : "Not closed on a benchmark: no closing error."
      : `Closing error ${live.misclosure >= 0 ? "+" : "−"}${Math.abs(live.misclosure * 1000).toFixed(0)} mm against a tolerance of ±${(tolerance * 1000).toFixed(0)} mm: ${live.withinTolerance ? "within tolerance" : "OUTSIDE tolerance — the run's levels will be flagged"}.`;

  return (
    <form onSubmit={submit} noValidate aria-label="Book a levelling run" className="no-print sheet space-y-3">
      <h2 className="text-lg font-bold">Book a run</h2>
      <div className="grid gap-3 sm:grid-cols-4">
        <div>
          <label className="label" htmlFor="run-date">
            Taken on
          </label>
          <input
            id="run-date"
            type="date"
            className="field num"
            value={takenOn}
            onChange={(e) => setTakenOn(e.target.value)}
          />
          <p className="field-error" aria-live="polite">
            {errors.takenOn ?? ""}
          </p>
        </div>
        <div>
          <label className="label" htmlFor="run-trench">
            Trench (optional)
          </label>
          <select id="run-trench" className="field" value={trenchId} onChange={(e) => setTrenchId(e.target.value)}>
            <option value="">—</option>
            {trenches.map((t) => (
              <option key={t.id} value={t.id}>
                {t.code}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="run-start">
            Starts from benchmark
          </label>
          <select id="run-start" className="field" value={startId} onChange={(e) => pickStart(e.target.value)}>
            <option value="">choose…</option>
            {choices.benchmarks.map((b) => (
              <option key={b.id} value={b.id}>
                {b.code} ({b.level.toFixed(3)})
              </option>
            ))}
          </select>
          <p className="field-error" aria-live="polite">
            {errors.startBenchmarkId ?? ""}
          </p>
        </div>
        <div>
          <label className="label" htmlFor="run-closing">
            Closes on benchmark
          </label>
          <select id="run-closing" className="field" value={closingId} onChange={(e) => pickClosing(e.target.value)}>
            <option value="">not closed</option>
            {choices.benchmarks.map((b) => (
              <option key={b.id} value={b.id}>
                {b.code} ({b.level.toFixed(3)})
              </option>
            ))}
          </select>
        </div>
      </div>
      <div className="overflow-x-auto">
        <table className="ledger" aria-label="Level book">
          <thead>
            <tr>
              <th className="num">Line</th>
              <th>Staff on</th>
              <th>Station</th>
              <th className="num">BS</th>
              <th className="num">IS</th>
              <th className="num">FS</th>
              <th className="num">HI</th>
              <th className="num">RL (m)</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {lines.map((l, i) => {
              const out = live.lines[i];
              const problem = lineError(i);
              return (
                <tr key={l.key} data-line={i + 1} aria-invalid={problem ? true : undefined}>
                  <td className="num">{i + 1}</td>
                  <td>
                    <LineTarget line={l} index={i} choices={choices} onChange={(patch) => change(l.key, patch)} />
                  </td>
                  <td>
                    <input
                      aria-label={`Line ${i + 1} station`}
                      className="field"
                      value={l.station}
                      placeholder={stationFor(l, choices)}
                      onChange={(e) => change(l.key, { station: e.target.value })}
                    />
                  </td>
                  {(["bs", "is", "fs"] as const).map((k) => (
                    <td key={k}>
                      <input
                        aria-label={`Line ${i + 1} ${{ bs: "backsight", is: "intermediate sight", fs: "foresight" }[k]}`}
                        className="field num w-24"
                        inputMode="decimal"
                        value={l[k]}
                        onChange={(e) => change(l.key, { [k]: e.target.value })}
                      />
                    </td>
                  ))}
                  <td className="num" data-hi>
                    {rl(out?.heightOfInstrument)}
                  </td>
                  <td className="num font-bold" data-rl>
                    {rl(out?.level)}
                  </td>
                  <td className="whitespace-nowrap">
                    <button
                      type="button"
                      className="btn"
                      aria-label={`Add a line after line ${i + 1}`}
                      onClick={() => addLine(i)}
                    >
                      +
                    </button>{" "}
                    <button
                      type="button"
                      className="btn"
                      aria-label={`Remove line ${i + 1}`}
                      onClick={() => removeLine(l.key)}
                      disabled={lines.length <= 2}
                    >
                      −
                    </button>
                    <p className="field-error max-w-56 whitespace-normal" aria-live="polite">
                      {problem}
                    </p>
                  </td>
                </tr>
              );
            })}
          </tbody>
          <tfoot>
            <tr>
              <td colSpan={3} className="text-right text-ink-soft">
                ΣBS − ΣFS = {rl(live.sumBacksights)} − {rl(live.sumForesights)} =
              </td>
              <td colSpan={3} className="num" data-rise>
                {rl(live.rise)}
              </td>
              <td colSpan={3} className="text-sm text-ink-soft">
                equals last RL − first RL
              </td>
            </tr>
          </tfoot>
        </table>
      </div>
      <p
        role="status"
        aria-live="polite"
        data-closure
        className={live.withinTolerance === false ? "font-bold text-warn" : ""}
      >
        {closure}
      </p>
      <p className="text-sm text-ink-soft">
        RL = reduced level in metres against {datumName}; HI = RL + backsight; RL = HI − sight. A change point carries a
        foresight and then the new backsight on one line.
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className="btn-primary" disabled={busy}>
          Book the run
        </button>
        <p className="font-semibold" role="alert" aria-live="assertive">
          {message}
        </p>
      </div>
    </form>
  );
}
