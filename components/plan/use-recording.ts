"use client";

import { useState } from "react";
import type { Pt } from "@/lib/geometry/outline-edit";
import type { Refused } from "./draw-marks";
import type { QuickFind } from "./find-form";
import type { ClassRow, FindRow } from "./rows";

type RecordOutcome = { ok: true; row: FindRow } | { ok: false; message: string; refused: Refused | null };

type Deps = {
  classMap: Map<string, ClassRow>;
  record: (at: Pt, v: QuickFind, cls: { code: string; label: string }) => Promise<RecordOutcome>;
  /** A recorded find is selected and the finds list shown. */
  onRecorded: (row: FindRow) => void;
};

/** Placing a find on the plan and recording it: where it goes, the form's last choices, a refusal to draw. */
export function useRecording({ classMap, record, onRecorded }: Deps) {
  const [placing, setPlacing] = useState<Pt | null>(null);
  const [refused, setRefused] = useState<Refused | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [lastFind, setLastFind] = useState<Partial<Pick<QuickFind, "classId" | "contextId">>>({});

  /** A tap with the place tool: the form opens for that point. */
  const place = (at: Pt) => {
    setPlacing(at);
    setRefused(null);
    setFormError(null);
  };

  const cancel = () => {
    setPlacing(null);
    setRefused(null);
    setFormError(null);
  };

  const submit = async (v: QuickFind) => {
    if (!placing) return;
    const cls = classMap.get(v.classId);
    setBusy(true);
    setLastFind({ classId: v.classId, contextId: v.contextId });
    const out = await record(placing, v, { code: cls?.code ?? "", label: cls?.label ?? "" });
    setBusy(false);
    if (out.ok) {
      setPlacing(null);
      setRefused(null);
      setFormError(null);
      onRecorded(out.row);
    } else {
      setFormError(`Not recorded: ${out.message}`);
      setRefused(out.refused);
    }
  };

  return { placing, setPlacing, refused, setRefused, formError, busy, lastFind, place, cancel, submit };
}
