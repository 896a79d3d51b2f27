import type { LevelBookRow } from "./levelling";

/**
 * Worked example. Its layout (BS / IS / FS columns, HI = RL + BS, RL = HI − sight, the check ΣBS − ΣFS =
 * last RL − first RL) is the height-of-collimation booking of the usual surveying textbooks, written here
 * from memory; the readings were made up for the tests and every RL below was worked by hand.
 *   BM A   BS 1.525              HI 51.525  RL 50.000
 *   find   IS 1.870                         RL 49.655
 *   find   IS 2.140                         RL 49.385
 *   CP1    BS 0.985  FS 2.615    HI 49.895  RL 48.910
 *   top    IS 1.005                         RL 48.890
 *   BM B             FS 1.760               RL 48.135   (known 48.130 → misclosure +0.005)
 *   ΣBS 2.510, ΣFS 4.375, ΣBS − ΣFS = −1.865 = 48.135 − 50.000
 */
export const workedBook: LevelBookRow[] = [
  { station: "BM A", backsight: 1.525 },
  { station: "find 17", intermediate: 1.87 },
  { station: "find 18", intermediate: 2.14 },
  { station: "CP1", foresight: 2.615, backsight: 0.985 },
  { station: "top of 1005", intermediate: 1.005 },
  { station: "BM B", foresight: 1.76 },
];
