import type { NumberRange, NumberStatus } from "@/lib/server/number-accounting";

/** The words of the number accounting, on screen and on paper. */
export const numberStatusWords: Record<NumberStatus, string> = {
  find: "Find",
  sample: "Sample",
  context: "Context sheet",
  reserved: "Reserved",
  void: "Void",
  unassigned: "Not handed out",
};

export const numberStatusOrder: NumberStatus[] = ["find", "sample", "context", "reserved", "void", "unassigned"];

/** Who holds or held the numbers. */
export function numberHolder(r: NumberRange): string {
  if (r.status === "reserved")
    return `${r.holder ?? "another member"}${r.deviceLabel ? ` on ${r.deviceLabel}` : ""}${r.deviceId ? ` (device ${r.deviceId.slice(0, 8)})` : ""}`;
  if (r.status === "void") return r.holder ?? "";
  return "";
}

/** Why the numbers are where they are. */
export function numberReason(r: NumberRange): string {
  if (r.status === "reserved") return "Held for recording offline; not used yet";
  if (r.status === "void") return `${r.reason ?? "void"}${r.by ? ` — made void by ${r.by}` : ""}`;
  if (r.status === "unassigned") return "Never handed out";
  return "";
}
