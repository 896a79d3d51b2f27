"use client";

import { useState } from "react";
import { ApiError, apiClient } from "@/lib/api/client";
import { countOf } from "@/lib/words/count";
import type { FindsBulk } from "@/lib/schemas/finds-bulk";
import { ProcessingFields, emptyDraft, processingBody, type BoxChoice } from "./processing-fields";

type Role = "digger" | "specialist" | "director";
/** A context finds may be moved to: open, in a trench with a valid outline (the server checks again). */
export type MoveTarget = { id: string; number: number; trenchId: string; trenchCode: string };
type Action = "move" | "reclass" | "delete" | "process";
const actionWords: Record<Action, string> = {
  move: "Move to another context",
  reclass: "Change class",
  delete: "Delete with a reason",
  process: "Processing and box",
};

/** The move targets in their trenches, in the order given (trench code, then number). */
function byTrench(contexts: MoveTarget[]): [string, MoveTarget[]][] {
  const groups = new Map<string, MoveTarget[]>();
  for (const c of contexts) groups.set(c.trenchCode, [...(groups.get(c.trenchCode) ?? []), c]);
  return [...groups];
}

/**
 * One change to every find picked in the register, all or nothing. The server decides (a refusal names each
 * find that stops it and why, and nothing changes); the bar only offers what the role may do: a specialist
 * re-classes and processes finds but does not move or delete them. Sent through the device's write path, so
 * with no connection the change waits in the outbox. A move offers only contexts open to new finds.
 */
export function BulkBar({
  siteId,
  role,
  ids,
  contexts,
  classes,
  boxes,
  onDone,
  onClear,
}: {
  siteId: string;
  role: Role;
  ids: string[];
  contexts: MoveTarget[];
  classes: { id: string; code: string; label: string }[];
  boxes: BoxChoice[];
  /** After a change: what was done, in words; the bar closes with the selection. */
  onDone: (said: string) => void;
  onClear: () => void;
}) {
  const actions: Action[] = role === "specialist" ? ["reclass", "process"] : ["move", "reclass", "delete", "process"];
  const [action, setAction] = useState<Action>(actions[0]!);
  const [contextId, setContextId] = useState("");
  const [classId, setClassId] = useState("");
  const [reason, setReason] = useState("");
  const [draft, setDraft] = useState(emptyDraft);
  const [busy, setBusy] = useState(false);
  const [refusal, setRefusal] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});

  const body = (): FindsBulk => {
    if (action === "move") return { action, findIds: ids, contextId };
    if (action === "reclass") return { action, findIds: ids, classId };
    if (action === "delete") return { action, findIds: ids, reason };
    return { action, findIds: ids, ...processingBody(draft) };
  };

  async function apply() {
    setBusy(true);
    setRefusal(null);
    setFieldErrors({});
    try {
      const answer = (await apiClient.call("findsBulk", { siteId }, body())) as {
        changed?: number;
        numbers?: number[];
        pending?: boolean;
      };
      onDone(
        answer.pending
          ? `No connection: the change to ${countOf(ids.length, "find")} waits on this device and is sent when the connection is back.`
          : `Done: ${countOf(answer.changed ?? 0, "find")} ${action === "delete" ? "deleted" : "changed"} (${(answer.numbers ?? []).join(", ")}).`,
      );
    } catch (err) {
      if (err instanceof ApiError) {
        setRefusal(err.message);
        setFieldErrors(err.fieldErrors ?? {});
      } else throw err;
    } finally {
      setBusy(false);
    }
  }

  const error = (field: string) =>
    fieldErrors[field]?.length ? (
      <p className="field-error" aria-live="polite">
        {fieldErrors[field]!.join(" ")}
      </p>
    ) : null;

  return (
    <section className="sheet space-y-3" aria-label="Change the finds picked">
      <div className="flex flex-wrap items-center gap-3">
        <p className="font-semibold">
          <span className="num">{countOf(ids.length, "find")}</span> picked
        </p>
        <button type="button" className="btn" onClick={onClear}>
          Clear the selection
        </button>
        <label className="label ml-auto" htmlFor="bulk-action">
          Change
        </label>
        <select
          id="bulk-action"
          className="field w-auto"
          value={action}
          onChange={(e) => {
            setAction(e.target.value as Action);
            setRefusal(null);
          }}
        >
          {actions.map((a) => (
            <option key={a} value={a}>
              {actionWords[a]}
            </option>
          ))}
        </select>
      </div>
      {action === "move" && (
        <div className="max-w-xs">
          <label className="label" htmlFor="bulk-context">
            Move to context
          </label>
          <select
            id="bulk-context"
            className="field num"
            value={contextId}
            onChange={(e) => setContextId(e.target.value)}
          >
            <option value="">Pick a context</option>
            {byTrench(contexts).map(([trench, list]) => (
              <optgroup key={trench} label={`Trench ${trench}`}>
                {list.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.number}
                  </option>
                ))}
              </optgroup>
            ))}
          </select>
          {contexts.length === 0 && (
            <p className="text-sm text-ink-soft">
              No context is open to take finds: contexts awaiting sign-off or signed off are not offered.
            </p>
          )}
          {error("contextId")}
        </div>
      )}
      {action === "reclass" && (
        <div className="max-w-xs">
          <label className="label" htmlFor="bulk-class">
            New class
          </label>
          <select id="bulk-class" className="field" value={classId} onChange={(e) => setClassId(e.target.value)}>
            <option value="">Pick a class</option>
            {classes.map((c) => (
              <option key={c.id} value={c.id}>
                {c.code} · {c.label}
              </option>
            ))}
          </select>
          {error("classId")}
        </div>
      )}
      {action === "delete" && (
        <div className="max-w-lg">
          <label className="label" htmlFor="bulk-reason">
            Why are they deleted?
          </label>
          <input id="bulk-reason" className="field" value={reason} onChange={(e) => setReason(e.target.value)} />
          {error("reason")}
        </div>
      )}
      {action === "process" && (
        <>
          <ProcessingFields idPrefix="bulk" draft={draft} boxes={boxes} onChange={setDraft} />
          {error("processing")}
          {error("sentTo")}
          {error("boxId")}
        </>
      )}
      <button type="button" className="btn-primary" disabled={busy} onClick={apply}>
        {busy ? "Changing…" : `${actionWords[action]}: ${countOf(ids.length, "find")}`}
      </button>
      <p role="alert" className="field-error">
        {refusal}
      </p>
    </section>
  );
}
