/**
 * Reducing a levelling run by the height-of-instrument (height-of-collimation) method, the usual booking on
 * excavations (field.md, "Levels"): a backsight (BS) on a point of known reduced level (RL) gives the height of
 * instrument HI = RL + BS; every intermediate sight (IS) or foresight (FS) gives RL = HI − reading; on a change
 * point the foresight is read, the instrument moves, and the change point's backsight gives the new HI.
 * All values are metres; every RL is against the site's datum.
 */

/** One line of the level book. A change point has both a foresight and, after the move, a backsight. */
export type LevelBookRow = {
  /** What the staff stood on: a benchmark code, a find number, "top of 1005", a change point, … */
  station: string;
  backsight?: number | null;
  intermediate?: number | null;
  foresight?: number | null;
};

export type LevelRun = {
  /** RL of the benchmark the first backsight is taken on. */
  startLevel: number;
  rows: readonly LevelBookRow[];
  /** Known RL of the benchmark the run closes on (its last foresight), when it closes on one. */
  closingLevel?: number | null;
  /** Largest acceptable misclosure in metres (site setting; common practice: a few millimetres). */
  tolerance: number;
};

export type ReducedRow = { station: string; heightOfInstrument: number; level: number };

export type ReducedRun = {
  rows: ReducedRow[];
  sumBacksights: number;
  sumForesights: number;
  /** The book's arithmetic check: ΣBS − ΣFS, which equals last RL − first RL. */
  rise: number;
  /** Computed RL of the closing benchmark minus its known RL; null on a run that does not close. */
  misclosure: number | null;
  /** False when the run closes outside tolerance: every level it gave is then flagged, never hidden. */
  withinTolerance: boolean | null;
};

export class LevelBookError extends Error {
  constructor(
    message: string,
    readonly row: number | null,
  ) {
    super(message);
    this.name = "LevelBookError";
  }
}

const present = (v: number | null | undefined): v is number => typeof v === "number";

/** Readings are staff readings: finite, and not longer than any levelling staff (10 m is generous). */
function checkReading(value: number, row: number, what: string): void {
  if (!Number.isFinite(value) || value < 0 || value > 10) {
    throw new LevelBookError(`Line ${row + 1}: the ${what} must be a staff reading between 0 and 10 m.`, row);
  }
}

/** Throws a LevelBookError naming the line when a line of the book cannot be reduced. */
export function checkRow(row: LevelBookRow, index: number, last: boolean): void {
  const { backsight: bs, intermediate: is, foresight: fs } = row;
  if (!present(bs) && !present(is) && !present(fs)) {
    throw new LevelBookError(`Line ${index + 1} (${row.station}) has no reading.`, index);
  }
  if (present(is) && (present(bs) || present(fs))) {
    throw new LevelBookError(
      `Line ${index + 1} (${row.station}): an intermediate sight stands alone on its line.`,
      index,
    );
  }
  if (index === 0 && (!present(bs) || present(fs))) {
    throw new LevelBookError("The first line is the backsight on the starting benchmark.", 0);
  }
  if (index > 0 && present(bs) && !present(fs)) {
    throw new LevelBookError(
      `Line ${index + 1} (${row.station}): a new backsight needs the foresight of its change point first.`,
      index,
    );
  }
  if (last && index > 0 && present(bs)) {
    throw new LevelBookError(
      `The last line (${row.station}) ends on a backsight: close the run with a foresight.`,
      index,
    );
  }
  if (present(bs)) checkReading(bs, index, "backsight");
  if (present(is)) checkReading(is, index, "intermediate sight");
  if (present(fs)) checkReading(fs, index, "foresight");
}

/** Rounds away binary noise below a micrometre, so booked millimetres come back as booked. */
export const tidy = (v: number) => Math.round(v * 1e6) / 1e6;

export function reduceLevelRun(run: LevelRun): ReducedRun {
  if (!Number.isFinite(run.startLevel)) throw new LevelBookError("The starting benchmark has no reduced level.", null);
  if (!(run.tolerance >= 0)) throw new LevelBookError("The closing tolerance must be zero or more metres.", null);
  if (run.rows.length < 2) throw new LevelBookError("A run needs a backsight and at least one more reading.", null);
  let hi = Number.NaN;
  let sumBs = 0;
  let sumFs = 0;
  const rows: ReducedRow[] = [];
  run.rows.forEach((row, i) => {
    checkRow(row, i, i === run.rows.length - 1);
    let level: number;
    if (i === 0) {
      level = run.startLevel;
    } else {
      const sight = present(row.foresight) ? row.foresight : (row.intermediate as number);
      level = tidy(hi - sight);
      if (present(row.foresight)) sumFs += row.foresight;
    }
    if (present(row.backsight)) {
      hi = tidy(level + row.backsight);
      sumBs += row.backsight;
    }
    rows.push({ station: row.station, heightOfInstrument: hi, level });
  });
  const lastLevel = rows[rows.length - 1]?.level ?? run.startLevel;
  const closes = present(run.closingLevel);
  const misclosure = closes ? tidy(lastLevel - (run.closingLevel as number)) : null;
  return {
    rows,
    sumBacksights: tidy(sumBs),
    sumForesights: tidy(sumFs),
    rise: tidy(sumBs - sumFs),
    misclosure,
    // Half a micrometre of slack so that a misclosure booked exactly at the tolerance counts as within it.
    withinTolerance: misclosure === null ? null : Math.abs(misclosure) <= run.tolerance + 5e-7,
  };
}
