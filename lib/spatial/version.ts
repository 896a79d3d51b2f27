/**
 * Version of the distribution-test engine, recorded on every result so that a stored verdict can be traced
 * to the code that produced it. Bump the minor part when an estimator or a default changes its numbers.
 */
export const ENGINE_VERSION = "0.2.0";
// 0.2.0  border correction per r: NaN (null in results) where no point is deep enough, the global test over
//        the distances where every curve is defined; the border default grid is no longer capped.
// 0.1.0  first release.
