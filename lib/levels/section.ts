/**
 * Sections of finds (field.md, "Sections of finds"): the finds within a band either side of a line drawn on
 * the plan, projected orthogonally onto the vertical plane through the line. Horizontal = distance along the
 * line from its start, vertical = reduced level. Finds beyond the line's ends are left out.
 */

export type SectionLine = { start: readonly [number, number]; end: readonly [number, number]; halfWidth: number };

export type SectionInput<T> = { x: number; y: number; level: number | null; item: T };

export type ProjectedFind<T> = {
  item: T;
  /** Metres along the line from its start. */
  along: number;
  /** Signed metres from the line: positive on the left looking from start to end. */
  offset: number;
  level: number;
};

export type Section<T> = {
  length: number;
  finds: ProjectedFind<T>[];
  /** Finds inside the band that carry no reduced level, so cannot be drawn: counted, not hidden. */
  withoutLevel: T[];
};

export function checkSectionLine(line: SectionLine): string | null {
  const coords = [...line.start, ...line.end, line.halfWidth];
  if (!coords.every(Number.isFinite)) return "The section line needs finite coordinates and band width.";
  if (!(line.halfWidth > 0)) return "The band either side of the section line must be wider than 0 m.";
  if (Math.hypot(line.end[0] - line.start[0], line.end[1] - line.start[1]) < 1e-3) {
    return "The section line must be at least a millimetre long.";
  }
  return null;
}

export function projectSection<T>(line: SectionLine, finds: readonly SectionInput<T>[]): Section<T> {
  const problem = checkSectionLine(line);
  if (problem) throw new RangeError(problem);
  const [x0, y0] = line.start;
  const dx = line.end[0] - x0;
  const dy = line.end[1] - y0;
  const length = Math.hypot(dx, dy);
  const ux = dx / length;
  const uy = dy / length;
  const out: Section<T> = { length, finds: [], withoutLevel: [] };
  for (const f of finds) {
    const px = f.x - x0;
    const py = f.y - y0;
    const along = px * ux + py * uy;
    const offset = ux * py - uy * px;
    if (along < 0 || along > length || Math.abs(offset) > line.halfWidth) continue;
    if (f.level === null || !Number.isFinite(f.level)) out.withoutLevel.push(f.item);
    else out.finds.push({ item: f.item, along, offset, level: f.level });
  }
  out.finds.sort((a, b) => a.along - b.along);
  return out;
}
