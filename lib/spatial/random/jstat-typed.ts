/**
 * The part of jstat (a well-known JavaScript statistics library, which ships no type declarations) that
 * the simulation side of the engine uses, with types.
 */
// @ts-expect-error -- jstat has no declarations; this module is the one typed doorway to it.
import jStatUntyped from "jstat";

interface JStatSubset {
  gammaln(x: number): number;
  normal: { cdf(x: number, mean: number, sd: number): number };
  chisquare: { cdf(x: number, df: number): number };
}

const jStat = jStatUntyped as JStatSubset;
export default jStat;
