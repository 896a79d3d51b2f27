"use client";

import { useMemo, useState } from "react";
import { checkOutline, distanceOutside } from "@/lib/geometry/outline";
import { nearestEdge, ringsToPolygon, type Pt, type Rings } from "@/lib/geometry/outline-edit";
import type { Refused } from "./draw-marks";
import type { QuickFind } from "./find-form";
import type { ClassRow, FindRow } from "./rows";

type RecordOutcome = { ok: true; row: FindRow } | { ok: false; message: string; refused: Refused | null };

type Deps = {
  classMap: Map<string, ClassRow>;
  record: (at: Pt, v: QuickFind, cls: { code: string; label: string }) => Promise<RecordOutcome>;
  /** A recorded find is selected and the finds list shown. */
  onRecorded: (row: FindRow) => void;
  /** The trench as saved: the server checks a find against this outline, and so does a tap. */
  trenchCode: string;
  savedRings: Rings;
  say: (kind: "ok" | "warn", text: string) => void;
};

/** Placing a find on the plan and recording it: where it goes, the form's last choices, a refusal to draw. */
export function useRecording({ classMap, record, onRecorded, trenchCode, savedRings, say }: Deps) {
  const [placing, setPlacing] = useState<Pt | null>(null);
  const [refused, setRefused] = useState<Refused | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [lastFind, setLastFind] = useState<Partial<Pick<QuickFind, "classId" | "contextId">>>({});

  const saved = useMemo(() => checkOutline(ringsToPolygon(savedRings)), [savedRings]);

  /**
   * A tap with the place tool: the form opens for that point — unless the point lies outside the saved
   * outline, which the server would refuse: then it is refused at the tap, with the distance, in the
   * server's words, and the refusal is drawn.
   */
  const place = (at: Pt) => {
    const d = saved.ok ? distanceOutside(saved.window, at[0], at[1]) : 0;
    if (d > 0) {
      setPlacing(null);
      setFormError(null);
      setRefused({ at, nearest: nearestEdge(savedRings, at[0], at[1])?.point ?? at, distance: d });
      say(
        "warn",
        `The find is outside its trench: (${at[0].toFixed(3)}, ${at[1].toFixed(3)}) lies ${d.toFixed(3)} m outside the outline of trench ${trenchCode}. No form opens: tap inside the outline.`,
      );
      return;
    }
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
