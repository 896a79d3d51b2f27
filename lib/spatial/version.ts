/**
 * Version of the distribution-test engine, recorded on every result so that a stored verdict can be traced
 * to the code that produced it. Bump the minor part when an estimator or a default changes its numbers.
 */
export const ENGINE_VERSION = "0.1.0";
