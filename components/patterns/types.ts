/** What the Patterns page hands its client island: the site's trenches, contexts and classes. */
export type TrenchOption = { id: string; code: string; name: string };
export type ContextOption = {
  id: string;
  trenchId: string;
  number: number;
  type: string;
  state: string;
  interpretation: string;
};
/** A spit of a context, with its top and base reduced levels (m above the site datum) where recorded. */
export type SpitOption = {
  id: string;
  contextId: string;
  number: number;
  topLevel: number | null;
  baseLevel: number | null;
};
export type ClassOption = { id: string; code: string; label: string; colour: string; symbol: string };
