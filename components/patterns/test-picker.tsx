"use client";

import type { ReactNode } from "react";
import type { ScopeSummary } from "@/lib/api/patterns-responses";
import type { SquareTestKind, TestKind } from "@/lib/schemas/run";
import type { FormState } from "./form-state";

type Props = { form: FormState; set: (f: Partial<FormState>) => void; summary: ScopeSummary | undefined };

function Row({
  title,
  source,
  on,
  onToggle,
  children,
  shortfall,
}: {
  title: string;
  source: string;
  on: boolean;
  onToggle: (v: boolean) => void;
  children?: ReactNode;
  shortfall: string[];
}) {
  return (
    <div className="border-b border-paper-edge py-2 last:border-0">
      <label className="flex min-h-11 items-center gap-2">
        <input type="checkbox" className="size-5" checked={on} onChange={(e) => onToggle(e.target.checked)} />
        <span className="font-semibold">{title}</span>
        <span className="text-xs text-ink-faint">{source}</span>
      </label>
      {on && children && <div className="ml-7 flex flex-wrap gap-3 text-sm">{children}</div>}
      {on && shortfall.length > 0 && (
        <p className="field-error ml-7" aria-live="polite">
          {shortfall.join(" ")}
        </p>
      )}
    </div>
  );
}

function Pick<T extends string>({
  label,
  value,
  options,
  onChange,
}: {
  label: string;
  value: T;
  options: [T, string][];
  onChange: (v: T) => void;
}) {
  return (
    <label className="flex flex-col">
      <span className="label">{label}</span>
      <select className="field w-auto" value={value} onChange={(e) => onChange(e.target.value as T)}>
        {options.map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </select>
    </label>
  );
}

/** Step 2: the tests, each with a specialist's default and its options. */
export function TestPicker({ form, set, summary }: Props) {
  const chosen = (summary?.classes ?? []).filter((c) => form.classIds.includes(c.id));
  const classOpts: [string, string][] = chosen.map((c) => [c.id, `${c.code} (n = ${c.n})`]);
  const short = (kind: TestKind, ids?: string[]) =>
    chosen
      .filter((c) => (ids ? ids.includes(c.id) : true) && c.n < (summary?.minPoints[kind] ?? 0))
      .map((c) => `${c.code} has ${c.n} finds here; this test needs at least ${summary!.minPoints[kind]}.`);
  return (
    <fieldset className="sheet">
      <legend className="px-1 text-lg font-bold">2 · Tests</legend>
      <p className="text-xs text-ink-soft">Per class: each chosen class is tested on its own.</p>
      <Row
        title="Besag's L, global envelope test under CSR"
        source="Ripley 1977; Besag 1977; Baddeley et al. 2014"
        on={form.lcsr.on}
        onToggle={(on) => set({ lcsr: { ...form.lcsr, on } })}
        shortfall={short("l-envelope")}
      >
        <Pick
          label="Global test"
          value={form.lcsr.statistic}
          options={[
            ["mad", "MAD (largest deviation)"],
            ["dclf", "DCLF (integrated)"],
          ]}
          onChange={(statistic) => set({ lcsr: { ...form.lcsr, statistic } })}
        />
        <Pick
          label="Simulated n"
          value={form.lcsr.count}
          options={[
            ["fixed", "Fixed at the observed n"],
            ["poisson", "Poisson with mean n"],
          ]}
          onChange={(count) => set({ lcsr: { ...form.lcsr, count } })}
        />
      </Row>
      <Row
        title="Clark–Evans nearest-neighbour test"
        source="Clark & Evans 1954; Besag & Diggle 1977"
        on={form.clarkEvans.on}
        onToggle={(on) => set({ clarkEvans: { ...form.clarkEvans, on } })}
        shortfall={short("clark-evans")}
      >
        <Pick
          label="Edge correction"
          value={form.clarkEvans.correction}
          options={[
            ["monte-carlo", "Monte Carlo in the trench (exact)"],
            ["donnelly", "Donnelly (rectangles; approximate)"],
            ["none", "None (as published)"],
          ]}
          onChange={(correction) => set({ clarkEvans: { ...form.clarkEvans, correction } })}
        />
        <Pick
          label="Alternative"
          value={form.clarkEvans.alternative}
          options={[
            ["two-sided", "Two-sided"],
            ["clustered", "Clustered"],
            ["regular", "Evenly spread"],
          ]}
          onChange={(alternative) => set({ clarkEvans: { ...form.clarkEvans, alternative } })}
        />
      </Row>
      <Row
        title="Quadrat counts"
        source="Greig-Smith 1952; Cochran 1954"
        on={form.quadrat.on}
        onToggle={(on) => set({ quadrat: { ...form.quadrat, on } })}
        shortfall={short("quadrat")}
      >
        <label className="flex flex-col">
          <span className="label">Cell size (m)</span>
          <input
            className="field w-28"
            inputMode="decimal"
            value={form.quadrat.cellSize}
            onChange={(e) => set({ quadrat: { ...form.quadrat, cellSize: e.target.value } })}
          />
        </label>
      </Row>
      <Row
        title="Pair correlation g(r)"
        source="Stoyan & Stoyan 1994"
        on={form.pcf.on}
        onToggle={(on) => set({ pcf: { on } })}
        shortfall={short("pcf-envelope")}
      />
      <p className="mt-3 text-xs text-ink-soft">Between two classes:</p>
      <Row
        title="Cross-L"
        source="Lotwick & Silverman 1982"
        on={form.cross.on}
        onToggle={(on) =>
          set({
            cross: {
              ...form.cross,
              on,
              a: form.cross.a || chosen[0]?.id || "",
              b: form.cross.b || chosen[1]?.id || "",
            },
          })
        }
        shortfall={short("cross-l", [form.cross.a, form.cross.b])}
      >
        <Pick
          label="Class A"
          value={form.cross.a}
          options={classOpts}
          onChange={(a) => set({ cross: { ...form.cross, a } })}
        />
        <Pick
          label="Class B"
          value={form.cross.b}
          options={classOpts}
          onChange={(b) => set({ cross: { ...form.cross, b } })}
        />
        <Pick
          label="Null hypothesis"
          value={form.cross.null}
          options={[
            ["random-labelling", "Random labelling (same spread?)"],
            ["a-fixed", "A fixed, B at random (B near A?)"],
          ]}
          onChange={(n) => set({ cross: { ...form.cross, null: n } })}
        />
        <Pick
          label="Function tested"
          value={form.cross.fun}
          options={[
            ["L", "Besag's cross-L"],
            ["K", "Ripley's cross-K"],
          ]}
          onChange={(fun) => set({ cross: { ...form.cross, fun } })}
        />
      </Row>
      <Row
        title="K difference (segregation)"
        source="Diggle & Chetwynd 1991"
        on={form.kdiff.on}
        onToggle={(on) =>
          set({ kdiff: { on, a: form.kdiff.a || chosen[0]?.id || "", b: form.kdiff.b || chosen[1]?.id || "" } })
        }
        shortfall={short("k-difference", [form.kdiff.a, form.kdiff.b])}
      >
        <Pick
          label="Class A"
          value={form.kdiff.a}
          options={classOpts}
          onChange={(a) => set({ kdiff: { ...form.kdiff, a } })}
        />
        <Pick
          label="Class B"
          value={form.kdiff.b}
          options={classOpts}
          onChange={(b) => set({ kdiff: { ...form.kdiff, b } })}
        />
      </Row>
      <p className="mt-3 text-xs text-ink-soft">Against an uneven background:</p>
      <Row
        title="Inhomogeneous L"
        source="Baddeley, Møller & Waagepetersen 2000"
        on={form.inhom.on}
        onToggle={(on) => set({ inhom: { ...form.inhom, on, classId: form.inhom.classId || chosen[0]?.id || "" } })}
        shortfall={short("inhomogeneous-l", [form.inhom.classId])}
      >
        <Pick
          label="Class"
          value={form.inhom.classId}
          options={classOpts}
          onChange={(classId) => set({ inhom: { ...form.inhom, classId } })}
        />
        <Pick
          label="Background density from"
          value={form.inhom.reference}
          options={[["all", "All finds in scope"], ...classOpts]}
          onChange={(reference) => set({ inhom: { ...form.inhom, reference } })}
        />
      </Row>
      <SquareTestRows form={form} set={set} />
    </fieldset>
  );
}

const SQUARE_TESTS: [SquareTestKind, string, string][] = [
  ["moran", "Moran's I", "Moran 1950; Cliff & Ord 1981"],
  ["geary", "Geary's C", "Geary 1954"],
  ["local-moran", "Local Moran's I (hot spots and outliers)", "Anselin 1995"],
  ["getis-ord", "Getis–Ord Gi* (hot and cold spots)", "Getis & Ord 1992; Ord & Getis 1995"],
];

/** Tests on the counts recorded by grid square (sieved finds), with the run's permutations, level and seed. */
function SquareTestRows({ form, set }: Pick<Props, "form" | "set">) {
  const sq = form.squares;
  const toggle = (kind: SquareTestKind, on: boolean) =>
    set({ squares: { ...sq, kinds: on ? [...sq.kinds, kind] : sq.kinds.filter((k) => k !== kind) } });
  return (
    <>
      <p className="mt-3 text-xs text-ink-soft">
        Counts by grid square (squares with counts recorded in the chosen contexts; the simulations are permutations of
        the counts over the squares):
      </p>
      {SQUARE_TESTS.map(([kind, title, source]) => (
        <Row
          key={kind}
          title={title}
          source={source}
          on={sq.kinds.includes(kind)}
          onToggle={(on) => toggle(kind, on)}
          shortfall={[]}
        />
      ))}
      {sq.kinds.length > 0 && (
        <div className="ml-7 flex flex-wrap gap-3 py-2 text-sm">
          <Pick
            label="Neighbours"
            value={sq.neighbours}
            options={[
              ["queen", "Queen (edge or corner)"],
              ["rook", "Rook (shared edge)"],
              ["distance", "Centres within 1.5 squares"],
            ]}
            onChange={(neighbours) => set({ squares: { ...sq, neighbours } })}
          />
          <Pick
            label="Weights"
            value={sq.style}
            options={[
              ["row", "Row-standardised"],
              ["binary", "Binary"],
            ]}
            onChange={(style) => set({ squares: { ...sq, style } })}
          />
          <Pick
            label="Variable"
            value={sq.variable}
            options={[
              ["density", "Density per excavated m²"],
              ["count", "Raw count"],
            ]}
            onChange={(variable) => set({ squares: { ...sq, variable } })}
          />
          <label className="flex flex-col">
            <span className="label">Leave out squares under (m²)</span>
            <input
              className="field w-28"
              inputMode="decimal"
              value={sq.minArea}
              onChange={(e) => set({ squares: { ...sq, minArea: e.target.value } })}
            />
          </label>
        </div>
      )}
    </>
  );
}

/** Step 3: parameters shared by every test of the run. */
export function ParamsFields({ form, set, summary, errors }: Props & { errors: Record<string, string[]> }) {
  const err = (k: string) => errors[k]?.join(" ");
  return (
    <fieldset className="sheet grid gap-3 sm:grid-cols-2">
      <legend className="px-1 text-lg font-bold">3 · Parameters</legend>
      <label className="flex flex-col">
        <span className="label">Edge correction</span>
        <select
          className="field"
          value={form.correction}
          onChange={(e) => set({ correction: e.target.value as FormState["correction"] })}
        >
          <option value="isotropic">Isotropic (Ripley)</option>
          <option value="translation">Translation (Ohser)</option>
          <option value="border">Border</option>
        </select>
      </label>
      <label className="flex flex-col">
        <span className="label">Largest distance r max (m)</span>
        <input
          className="field"
          inputMode="decimal"
          placeholder={
            summary ? `${summary.defaults.rmax} (a quarter of the short side)` : "a quarter of the short side"
          }
          value={form.rmax}
          onChange={(e) => set({ rmax: e.target.value })}
        />
        {err("params.rmax") && (
          <span className="field-error" aria-live="polite">
            {err("params.rmax")}
          </span>
        )}
      </label>
      <label className="flex flex-col">
        <span className="label">Simulations</span>
        <input
          className="field"
          inputMode="numeric"
          value={form.nsim}
          onChange={(e) => set({ nsim: e.target.value })}
        />
        {err("params.nsim") && (
          <span className="field-error" aria-live="polite">
            {err("params.nsim")}
          </span>
        )}
      </label>
      <label className="flex flex-col">
        <span className="label">Significance level</span>
        <input
          className="field"
          inputMode="decimal"
          value={form.level}
          onChange={(e) => set({ level: e.target.value })}
        />
        {err("params.level") && (
          <span className="field-error" aria-live="polite">
            {err("params.level")}
          </span>
        )}
      </label>
      <label className="flex flex-col sm:col-span-2">
        <span className="label">Seed (blank: a new one is drawn and recorded)</span>
        <input
          className="field"
          inputMode="numeric"
          value={form.seed}
          onChange={(e) => set({ seed: e.target.value })}
        />
        {err("params.seed") && (
          <span className="field-error" aria-live="polite">
            {err("params.seed")}
          </span>
        )}
      </label>
    </fieldset>
  );
}
