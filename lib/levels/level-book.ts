import { checkRow, LevelBookError, tidy, type LevelBookRow } from "./levelling";

/**
 * The level book as the digger types it: every line reduced as soon as it can be (height-of-instrument
 * method, as reduceLevelRun), with a problem named on the line instead of a refusal, so the book can be
 * checked while it is booked. The server reduces the finished book again with reduceLevelRun; a book with
 * no problem here gives the same levels there (a property test holds it).
 */
export type BookedLine = { heightOfInstrument: number | null; level: number | null; problem: string | null };

export type BookedRun = {
  lines: BookedLine[];
  sumBacksights: number;
  sumForesights: number;
  /** ΣBS − ΣFS; equals last RL − first RL on a book without problems. */
  rise: number;
  /** Last RL minus the closing benchmark's known RL, once the book ends on a foresight; null otherwise. */
  misclosure: number | null;
  withinTolerance: boolean | null;
  /** What still keeps the whole book from being booked (null when it can be sent). */
  unfinished: string | null;
};

const present = (v: number | null | undefined): v is number => typeof v === "number";

export function reduceAsBooked(
  startLevel: number | null,
  rows: readonly LevelBookRow[],
  closingLevel: number | null,
  tolerance: number,
): BookedRun {
  let hi: number | null = null;
  let sumBs = 0;
  let sumFs = 0;
  let problems = 0;
  const lines: BookedLine[] = rows.map((row, i) => {
    try {
      checkRow(row, i, false);
    } catch (err) {
      if (!(err instanceof LevelBookError)) throw err;
      problems++;
      // A line that cannot be read leaves the height of instrument unknown if it was meant to set a new one.
      if (present(row.backsight)) hi = null;
      return { heightOfInstrument: hi, level: null, problem: err.message };
    }
    let level: number | null;
    if (i === 0) level = startLevel;
    else {
      const sight = present(row.foresight) ? row.foresight : (row.intermediate as number);
      level = hi === null ? null : tidy(hi - sight);
      if (present(row.foresight)) sumFs += row.foresight;
    }
    if (present(row.backsight)) {
      hi = level === null ? null : tidy(level + row.backsight);
      sumBs += row.backsight;
    }
    return { heightOfInstrument: hi, level, problem: null };
  });
  const last = rows[rows.length - 1];
  const lastLevel = lines[lines.length - 1]?.level ?? null;
  let unfinished: string | null = null;
  if (startLevel === null) unfinished = "Choose the benchmark the run starts from.";
  else if (rows.length < 2) unfinished = "A run needs a backsight and at least one more reading.";
  else if (problems > 0) unfinished = `${problems} line${problems === 1 ? "" : "s"} of the book cannot be reduced yet.`;
  else if (last && present(last.backsight))
    unfinished = "The book ends on a backsight: close the run with a foresight.";
  const closes =
    present(closingLevel) && !unfinished && last !== undefined && present(last.foresight) && lastLevel !== null;
  const misclosure = closes ? tidy(lastLevel - closingLevel) : null;
  return {
    lines,
    sumBacksights: tidy(sumBs),
    sumForesights: tidy(sumFs),
    rise: tidy(sumBs - sumFs),
    misclosure,
    withinTolerance: misclosure === null ? null : Math.abs(misclosure) <= tolerance + 5e-7,
    unfinished,
  };
}

/** A staff reading as typed: blank is no reading; anything else must read as a number (comma or point). */
export function readReading(text: string): number | null | "bad" {
  const t = text.trim().replace(",", ".");
  if (t === "") return null;
  if (!/^\d{0,2}(\.\d{0,4})?$/.test(t) || t === ".") return "bad";
  return Number(t);
}
