"use client";

import { useEffect, useState } from "react";
import type { RegisterView } from "./register-query";

export type RegisterOptions = {
  trenches: { id: string; code: string }[];
  contexts: { id: string; number: number }[];
  classes: { id: string; code: string; label: string }[];
  recorders: { id: string; name: string }[];
};

/** Filters of the register; every change goes to the URL, which the table reads. */
export function RegisterFilters({
  view,
  options,
  onChange,
}: {
  view: RegisterView;
  options: RegisterOptions;
  onChange: (c: RegisterView) => void;
}) {
  const [text, setText] = useState(view.q ?? "");
  useEffect(() => setText(view.q ?? ""), [view.q]);
  const select = (key: keyof RegisterView, label: string, items: { id: string; text: string }[]) => (
    <div>
      <label className="label" htmlFor={`f-${key}`}>
        {label}
      </label>
      <select
        id={`f-${key}`}
        className="field"
        value={view[key] ?? ""}
        onChange={(e) => onChange({ [key]: e.target.value })}
      >
        <option value="">all</option>
        {items.map((i) => (
          <option key={i.id} value={i.id}>
            {i.text}
          </option>
        ))}
      </select>
    </div>
  );
  return (
    <form
      className="sheet grid gap-3 sm:grid-cols-3 lg:grid-cols-7"
      role="search"
      aria-label="Filter the register"
      onSubmit={(e) => {
        e.preventDefault();
        onChange({ q: text.trim() });
      }}
    >
      {select(
        "trenchId",
        "Trench",
        options.trenches.map((t) => ({ id: t.id, text: t.code })),
      )}
      {select(
        "contextId",
        "Context",
        options.contexts.map((c) => ({ id: c.id, text: String(c.number) })),
      )}
      {select(
        "classId",
        "Class",
        options.classes.map((c) => ({ id: c.id, text: `${c.code} · ${c.label}` })),
      )}
      {select(
        "recordedBy",
        "Recorder",
        options.recorders.map((r) => ({ id: r.id, text: r.name })),
      )}
      <div>
        <label className="label" htmlFor="f-from">
          Recorded from
        </label>
        <input
          id="f-from"
          type="date"
          className="field"
          value={view.from ?? ""}
          onChange={(e) => onChange({ from: e.target.value })}
        />
      </div>
      <div>
        <label className="label" htmlFor="f-to">
          Recorded to
        </label>
        <input
          id="f-to"
          type="date"
          className="field"
          value={view.to ?? ""}
          onChange={(e) => onChange({ to: e.target.value })}
        />
      </div>
      <div>
        <label className="label" htmlFor="f-q">
          Search
        </label>
        <div className="flex gap-1">
          <input
            id="f-q"
            type="search"
            className="field"
            placeholder="number or words"
            value={text}
            onChange={(e) => setText(e.target.value)}
            onBlur={() => text.trim() !== (view.q ?? "") && onChange({ q: text.trim() })}
          />
          <button type="submit" className="btn px-3">
            Search
          </button>
        </div>
      </div>
    </form>
  );
}
