/**
 * Version of the distribution-test engine, recorded on every result so that a stored verdict can be traced
 * to the code that produced it. Bump the minor part when an estimator or a default changes its numbers.
 */
export const ENGINE_VERSION = "0.3.0";
// 0.3.0  distances (and boundary distances, and finds on quadrat lines) within rounding (64 units in the last
//        place of the coordinates) of a grid value are taken as equal to it, so no estimate depends on where
//        the trench lies on the site grid.
// 0.2.0  border correction per r: NaN (null in results) where no point is deep enough, the global test over
//        the distances where every curve is defined; the border default grid is no longer capped.
// 0.1.0  first release.
