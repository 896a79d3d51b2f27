import { LabelSheets } from "@/components/labels/label-sheets";
import { FilterSelect } from "@/components/register/filter-select";
import { SiteNav } from "@/components/site-nav";
import { PrintButton } from "@/components/sign-off/print-button";
import { labelPresets, layoutQuery, perSheet, presetKeys } from "@/lib/labels/layout";
import { pageSiteActor, type SiteSearchPageProps } from "@/lib/server/page-access";
import { MAX_LABELS, labelSelection } from "@/lib/schemas/labels";
import { filledIn } from "@/lib/schemas/url-query";
import "./labels.css";

const measures = [
  ["columns", "Columns", "1"],
  ["rows", "Rows", "1"],
  ["widthMm", "Label width (mm)", "0.1"],
  ["heightMm", "Label height (mm)", "0.1"],
  ["topMm", "Top margin (mm)", "0.05"],
  ["leftMm", "Left margin (mm)", "0.05"],
  ["gapXMm", "Gap between columns (mm)", "0.1"],
  ["gapYMm", "Gap between rows (mm)", "0.1"],
] as const;

const numberBounds = [
  ["lb-from", "fromNumber", "From number"],
  ["lb-to", "toNumber", "To number"],
] as const;

/**
 * Bag labels for finds and samples, and box labels listing what each box holds, on the A4 sheet the user
 * picks; printed from the browser as shown.
 */
export default async function LabelsPage({ params, searchParams }: SiteSearchPageProps) {
  const { siteId } = await params;
  const search: Partial<Record<string, string>> = filledIn(await searchParams);
  const { actor, read } = await pageSiteActor(siteId);
  const layoutParsed = layoutQuery.safeParse(search);
  const selectionParsed = labelSelection.safeParse(search);
  const problems = [...(layoutParsed.error?.issues ?? []), ...(selectionParsed.error?.issues ?? [])].map(
    (i) => `${i.path.join(".")}: ${i.message}`,
  );
  const layout = layoutParsed.success ? layoutParsed.data.layout : layoutQuery.parse({}).layout;
  const preset = layoutParsed.success ? layoutParsed.data.preset : "21";
  const selection = selectionParsed.success ? selectionParsed.data : null;
  const [contexts, labels] = await Promise.all([
    read.contexts(),
    selection && problems.length === 0 ? read.labels(selection) : Promise.resolve(null),
  ]);
  const sheets = labels ? Math.ceil(labels.items.length / perSheet(layout)) : 0;
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/labels`} />
      <main className="label-sheets-page mx-auto max-w-5xl space-y-4 px-4 py-6">
        <div className="no-print space-y-4">
          <h1 className="text-3xl font-bold">Labels</h1>
          <form method="get" className="sheet space-y-3" aria-label="Labels to print">
            <div className="grid gap-3 sm:grid-cols-4">
              <div>
                <label className="label" htmlFor="lb-kind">
                  Records
                </label>
                <select id="lb-kind" name="kind" className="field" defaultValue={search.kind ?? "finds"}>
                  <option value="finds">Finds</option>
                  <option value="samples">Samples</option>
                  <option value="boxes">Boxes (with their contents)</option>
                </select>
              </div>
              <FilterSelect
                id="lb-context"
                name="contextId"
                label="Context"
                value={search.contextId}
                items={contexts.map((c) => ({ id: c.id, text: String(c.number) }))}
                numeric
              />
              {numberBounds.map(([id, name, label]) => (
                <div key={id}>
                  <label className="label" htmlFor={id}>
                    {label}
                  </label>
                  <input
                    id={id}
                    name={name}
                    className="field num"
                    inputMode="numeric"
                    defaultValue={search[name] ?? ""}
                  />
                </div>
              ))}
            </div>
            {search.ids && <input type="hidden" name="ids" value={search.ids} />}
            <div>
              <label className="label" htmlFor="lb-preset">
                Sheet of labels
              </label>
              <select id="lb-preset" name="preset" className="field" defaultValue={preset}>
                {presetKeys.map((k) => (
                  <option key={k} value={k}>
                    {labelPresets[k].name}
                  </option>
                ))}
              </select>
            </div>
            <details open={measures.some(([k]) => search[k] !== undefined)}>
              <summary className="cursor-pointer font-semibold">
                Another layout: columns, rows, label size, margins
              </summary>
              <div className="mt-2 grid gap-3 sm:grid-cols-4">
                {measures.map(([name, label, step]) => (
                  <div key={name}>
                    <label className="label" htmlFor={`lb-${name}`}>
                      {label}
                    </label>
                    <input
                      id={`lb-${name}`}
                      name={name}
                      className="field num"
                      type="number"
                      step={step}
                      placeholder={String(layout[name])}
                      defaultValue={search[name] ?? ""}
                    />
                  </div>
                ))}
              </div>
            </details>
            <div className="flex flex-wrap items-center gap-3">
              <button type="submit" className="btn">
                Show the labels
              </button>
              {labels && labels.items.length > 0 && (
                <PrintButton
                  label={`Print ${labels.items.length} labels (${sheets} ${sheets === 1 ? "sheet" : "sheets"})`}
                />
              )}
            </div>
            <p className="field-error" role="alert">
              {problems.join(" · ")}
            </p>
          </form>
          {labels?.truncated && (
            <p className="sheet text-warn">
              Only the first {MAX_LABELS} labels are shown; narrow the numbers to print the rest.
            </p>
          )}
          {labels && labels.items.length === 0 && (
            <p className="sheet">
              No {search.kind === "samples" || search.kind === "boxes" ? search.kind : "finds"} match.
            </p>
          )}
          <p className="text-sm text-ink-soft">
            Print at 100 % (no “fit to page”). Each code holds{" "}
            {actor.site.labelAddress ? `the site's address, ${actor.site.labelAddress}, then` : ""} the site code, the
            kind and the number, so it still names the record if the server moves.
          </p>
        </div>
        {labels && <LabelSheets items={labels.items} layout={layout} siteCode={actor.site.code} />}
      </main>
    </>
  );
}
