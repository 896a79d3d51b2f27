/** A scope's depth limits in words, e.g. "RL 41.10 to 41.30 m above the site datum; spits 1005/1, 1005/2". */
export function depthWords(d: {
  levelFrom: number | null;
  levelTo: number | null;
  spits: { label: string }[];
}): string {
  const rl = (v: number) => v.toFixed(3);
  const parts: string[] = [];
  if (d.levelFrom !== null && d.levelTo !== null) parts.push(`RL ${rl(d.levelFrom)} to ${rl(d.levelTo)} m`);
  else if (d.levelFrom !== null) parts.push(`RL ${rl(d.levelFrom)} m and above`);
  else if (d.levelTo !== null) parts.push(`RL ${rl(d.levelTo)} m and below`);
  if (d.spits.length) parts.push(`spit${d.spits.length > 1 ? "s" : ""} ${d.spits.map((s) => s.label).join(", ")}`);
  return parts.join("; ");
}

/** "3 finds with no level left out: 12, 15, 31" (the first `max` numbers, then how many more). */
export function leftOutWords(what: string, numbers: number[], max = 20): string {
  const n = numbers.length;
  const shown = numbers.slice(0, max).join(", ");
  const more = n > max ? ` and ${n - max} more` : "";
  return `${n} ${n === 1 ? "find" : "finds"} ${what} left out: ${shown}${more}`;
}
