/**
 * Bounds on the size of a window's outline, far beyond any trench drawn or surveyed (a traced trench edge
 * has tens to a few hundred vertices), so that checking one outline is a bounded piece of work.
 */
export const MAX_RING_VERTICES = 2000;
/** Holes are baulks and sondages left standing: a handful per trench. */
export const MAX_HOLES = 20;

/** "2,000": the limit as refusals state it. */
export const formatLimit = (n: number) => n.toLocaleString("en-GB");
