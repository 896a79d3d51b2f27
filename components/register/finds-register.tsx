"use client";

import { keepPreviousData, useQuery, useQueryClient } from "@tanstack/react-query";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from "@tanstack/react-table";
import Link from "next/link";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { useMemo, useRef, useState } from "react";
import { apiClient } from "@/lib/api/client";
import { ClassMark } from "./class-mark";
import { Fragment } from "react";
import { FindPanel, type RegisterRow } from "./find-panel";
import { RegisterFilters, type RegisterOptions } from "./register-filters";
import { readView, viewQuery, withChange, type RegisterView } from "./register-query";
import { countOf } from "@/lib/words/count";
import { findProcessingLabels } from "@/lib/schemas/processing";
import { useDates } from "@/components/locale";
import { BulkBar, type MoveTarget } from "./bulk-bar";
import type { BoxChoice } from "./processing-fields";

const sortable = new Set(["number", "trench", "context", "class", "recorder", "x", "y", "z", "recordedAt"]);
const metres = (v: number | null) => (v === null ? "—" : v.toFixed(3));

const columns: ColumnDef<RegisterRow>[] = [
  { id: "pick", header: "Pick" },
  { id: "number", header: "Find", cell: (c) => <span className="font-bold">{c.row.original.number}</span> },
  { id: "trench", header: "Trench", cell: (c) => c.row.original.trenchCode },
  { id: "context", header: "Context", cell: (c) => c.row.original.contextNumber },
  {
    id: "class",
    header: "Class",
    cell: (c) => (
      <span>
        <ClassMark symbol={c.row.original.classSymbol} colour={c.row.original.classColour} />
        {c.row.original.classCode}
      </span>
    ),
  },
  { id: "x", header: "x (m)", cell: (c) => metres(c.row.original.x) },
  { id: "y", header: "y (m)", cell: (c) => metres(c.row.original.y) },
  { id: "z", header: "RL (m)", cell: (c) => metres(c.row.original.z) },
  { id: "recorder", header: "Recorder", cell: (c) => c.row.original.recordedBy ?? "—" },
  { id: "recordedAt", header: "Recorded", cell: (c) => <RecordedDay at={c.row.original.recordedAt} /> },
  {
    id: "processing",
    header: "Processing",
    cell: (c) => (
      <span className="whitespace-nowrap">
        {c.row.original.processing ? findProcessingLabels[c.row.original.processing] : "—"}
        {c.row.original.boxNumber !== null && c.row.original.boxNumber !== undefined
          ? ` · box ${c.row.original.boxNumber}`
          : ""}
      </span>
    ),
  },
  {
    id: "description",
    header: "Description",
    cell: (c) => <span className="block max-w-xs truncate">{c.row.original.description}</span>,
  },
];
const numeric = new Set(["number", "context", "x", "y", "z", "recordedAt"]);

/**
 * The finds register: server-side filters, sorting and paging, all held in the URL. Finds are picked by hand
 * (a click, shift-click for a run of rows) or all that match the filters, then changed together in the bar.
 */
export function FindsRegister({
  siteId,
  options,
  canImport,
  hasCrs,
  role,
  boxes,
  moveTargets,
}: {
  siteId: string;
  options: RegisterOptions;
  canImport: boolean;
  hasCrs: boolean;
  role: "digger" | "specialist" | "director";
  boxes: BoxChoice[];
  /** Contexts finds may be moved to (open, in a trench with a valid outline). */
  moveTargets: MoveTarget[];
}) {
  const queryClient = useQueryClient();
  const [picked, setPicked] = useState<Record<string, boolean>>({});
  const [allNote, setAllNote] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const lastPicked = useRef<number | null>(null);
  const pickedIds = Object.keys(picked).filter((k) => picked[k]);
  const router = useRouter();
  const pathname = usePathname();
  const params = useSearchParams();
  const view = useMemo(() => readView(new URLSearchParams(params.toString())), [params]);
  const [openId, setOpenId] = useState<string | null>(null);
  const go = (change: RegisterView) =>
    router.replace(`${pathname}?${viewQuery(withChange(view, change))}`, { scroll: false });
  const qs = viewQuery(view);
  const data = useQuery({
    queryKey: ["finds", siteId, qs],
    queryFn: () => apiClient.call("findsList", { siteId }, view),
    placeholderData: keepPreviousData,
  });
  const pageSize = Number(view.pageSize ?? 50);
  const page = Number(view.page ?? 1);
  const total = data.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const sorting: SortingState = [{ id: view.sort ?? "number", desc: view.dir === "desc" }];
  const table = useReactTable({
    data: data.data?.rows ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    pageCount: pages,
    state: { sorting, pagination: { pageIndex: page - 1, pageSize }, rowSelection: picked },
    enableRowSelection: true,
    enableSortingRemoval: false,
    getRowId: (r) => r.id,
  });
  const sortBy = (id: string) =>
    go({ sort: id, dir: view.sort === id && view.dir !== "desc" ? "desc" : "asc", page: "" });
  const exportQs = viewQuery(view, ["page", "pageSize"]);
  const pageRows = table.getRowModel().rows;
  /** A click picks one row; with shift held, every row from the last one clicked to this one takes its state. */
  const pick = (index: number, on: boolean, range: boolean) => {
    const from = range && lastPicked.current !== null ? Math.min(lastPicked.current, index) : index;
    const to = range && lastPicked.current !== null ? Math.max(lastPicked.current, index) : index;
    const next = { ...picked };
    for (const r of pageRows.slice(from, to + 1)) {
      if (on) next[r.id] = true;
      else delete next[r.id];
    }
    lastPicked.current = index;
    setPicked(next);
  };
  const pageAllPicked = pageRows.length > 0 && pageRows.every((r) => picked[r.id]);
  async function pickAllMatching() {
    const { page: _p, pageSize: _s, ...filters } = view;
    const answer = await apiClient.call("findIds", { siteId }, filters);
    setPicked(Object.fromEntries(answer.ids.map((id) => [id, true])));
    setDone(null);
    setAllNote(
      answer.truncated
        ? `Only the first ${countOf(answer.ids.length, "find")} of ${answer.total.toLocaleString("en-GB")} were picked: a change takes at most that many at once.`
        : null,
    );
  }
  const clearPicks = () => {
    setPicked({});
    setAllNote(null);
    lastPicked.current = null;
  };

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <a className="btn" href={`/api/sites/${siteId}/export/finds?format=csv&${exportQs}`} download>
          Export CSV
        </a>
        {hasCrs && (
          <a className="btn" href={`/api/sites/${siteId}/export/finds?format=geojson&${exportQs}`} download>
            GeoJSON (WGS 84)
          </a>
        )}
        <a className="btn" href={`/api/sites/${siteId}/export/gis`} download>
          GeoPackage (GIS)
        </a>
        {canImport && (
          <Link className="btn-primary" href={`/sites/${siteId}/finds/import`}>
            Import total-station CSV
          </Link>
        )}
        {Object.keys(view).some((k) => !["sort", "dir", "page", "pageSize"].includes(k)) && (
          <button type="button" className="btn" onClick={() => router.replace(pathname)}>
            Clear filters
          </button>
        )}
      </div>
      <RegisterFilters view={view} options={options} onChange={go} />
      <div className="flex flex-wrap items-center gap-2">
        <button type="button" className="btn" disabled={total === 0} onClick={() => void pickAllMatching()}>
          Pick all {countOf(total, "find")} that match
        </button>
        {allNote && <p className="text-sm text-warn">{allNote}</p>}
        <p role="status" className="font-semibold text-ok">
          {done}
        </p>
      </div>
      {pickedIds.length > 0 && (
        <BulkBar
          siteId={siteId}
          role={role}
          ids={pickedIds}
          contexts={moveTargets}
          classes={options.classes}
          boxes={boxes}
          onClear={clearPicks}
          onDone={(said) => {
            setDone(said);
            clearPicks();
            void queryClient.invalidateQueries({ queryKey: ["finds", siteId] });
          }}
        />
      )}
      <p aria-live="polite" className="text-sm text-ink-soft">
        {data.isFetching ? (
          "Reading the register…"
        ) : (
          <>
            <span className="num">{countOf(total, "find")}</span> {total === 1 ? "matches" : "match"} · page{" "}
            <span className="num">{page}</span> of <span className="num">{pages}</span>
          </>
        )}
      </p>
      {data.error && (
        <p role="alert" className="field-error">
          {data.error.message}
        </p>
      )}
      <div className="overflow-x-auto">
        <table className="ledger sheet" aria-label="Finds register">
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const active = sorting[0]?.id === h.id;
                  return (
                    <th
                      key={h.id}
                      className={numeric.has(h.id) ? "num" : ""}
                      aria-sort={active ? (sorting[0]?.desc ? "descending" : "ascending") : undefined}
                    >
                      {h.id === "pick" ? (
                        <label className="inline-flex min-h-11 items-center gap-1">
                          <input
                            type="checkbox"
                            checked={pageAllPicked}
                            onChange={(e) => {
                              const next = { ...picked };
                              for (const r of pageRows) {
                                if (e.target.checked) next[r.id] = true;
                                else delete next[r.id];
                              }
                              setPicked(next);
                            }}
                          />
                          <span className="sr-only">Pick every find on this page</span>
                        </label>
                      ) : sortable.has(h.id) ? (
                        <button
                          type="button"
                          className="inline-flex min-h-11 items-center gap-1 font-semibold"
                          onClick={() => sortBy(h.id)}
                        >
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden>{active ? (sorting[0]?.desc ? "▼" : "▲") : "↕"}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {pageRows.map((row, index) => (
              <Fragment key={row.id}>
                <tr
                  className={`cursor-pointer ${row.id === openId ? "bg-accent-light" : "hover:bg-paper-deep"}`}
                  onClick={() => setOpenId(row.id === openId ? null : row.id)}
                >
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className={numeric.has(cell.column.id) ? "num" : ""}>
                      {cell.column.id === "pick" ? (
                        <label
                          className="inline-flex min-h-11 min-w-11 items-center"
                          onClick={(e) => e.stopPropagation()}
                        >
                          <input
                            type="checkbox"
                            checked={!!picked[row.id]}
                            onChange={() => undefined}
                            onClick={(e) => {
                              e.stopPropagation();
                              pick(index, !picked[row.id], e.shiftKey);
                            }}
                          />
                          <span className="sr-only">Pick find {row.original.number}</span>
                        </label>
                      ) : cell.column.id === "number" ? (
                        <button
                          type="button"
                          className="min-h-11 font-bold underline"
                          aria-expanded={row.id === openId}
                          onClick={(e) => {
                            e.stopPropagation();
                            setOpenId(row.id === openId ? null : row.id);
                          }}
                        >
                          {row.original.number}
                        </button>
                      ) : (
                        flexRender(cell.column.columnDef.cell, cell.getContext())
                      )}
                    </td>
                  ))}
                </tr>
                {row.id === openId && (
                  <tr>
                    <td colSpan={columns.length} className="bg-paper-deep p-2">
                      <FindPanel siteId={siteId} find={row.original} onClose={() => setOpenId(null)} />
                    </td>
                  </tr>
                )}
              </Fragment>
            ))}
          </tbody>
        </table>
      </div>
      <nav aria-label="Pages" className="flex flex-wrap items-center gap-2">
        <button type="button" className="btn" disabled={page <= 1} onClick={() => go({ page: String(page - 1) })}>
          ← Previous
        </button>
        <button type="button" className="btn" disabled={page >= pages} onClick={() => go({ page: String(page + 1) })}>
          Next →
        </button>
        <label className="ml-auto text-sm" htmlFor="f-size">
          Rows a page
        </label>
        <select id="f-size" className="field w-24" value={pageSize} onChange={(e) => go({ pageSize: e.target.value })}>
          {[25, 50, 100, 250, 500].map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </select>
      </nav>
    </div>
  );
}

/** The day a find was recorded, in the reader's one date format. */
function RecordedDay({ at }: { at: string }) {
  const { day } = useDates();
  return <>{day(at)}</>;
}
