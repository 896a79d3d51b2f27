import type { RunResult } from "./run-result";
import type { RunScope, RunTest, SquareTest, TestKind } from "@/lib/schemas/run";
import type { StratWarning } from "@/lib/stratigraphy/one-surface";
import type { VerticalSpread } from "@/lib/levels/vertical-spread";

/** A run as the API returns it. `outOfDate` is computed on read from the fingerprint. Types only. */
export type RunParamsStored = {
  /** Runs stored in the former shape only: the edge correction their tests shared (now on each test). */
  correction?: "isotropic" | "translation" | "border";
  rmax: number;
  nsim: number;
  level: number;
  /** The engine's test descriptions, classes named by record id (former-shape rows are read into this shape). */
  tests: RunTest[];
  /** Tests on counts by grid square (absent in runs stored before they existed). */
  squareTests?: SquareTest[];
  label?: string;
  /** Names at the time of the run, for lists. */
  names: { trench: string; contexts: number[]; classes: string[] };
  warnings: StratWarning[];
  /** The scope's depth limits (level range, spits) and the finds they left out; absent for whole contexts. */
  depth?: ScopeDepthSummary;
};

export type RunView = {
  id: string;
  status: "queued" | "running" | "done" | "failed" | "cancelled";
  progress: number;
  error: string | null;
  seed: number;
  engineVersion: string;
  fingerprint: string;
  outOfDate: boolean;
  scope: RunScope;
  params: RunParamsStored;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  /** Server clock when this view was made, so the client can estimate time remaining without clock skew. */
  now: string;
  result: RunResult | null;
};

/** What the workspace shows before a run (lib/server/analysis/scope-summary.ts builds it). */
export type ScopeSummary = {
  trench: { id: string; code: string; area: number; shortSide: number };
  classes: {
    id: string;
    code: string;
    label: string;
    colour: string;
    symbol: string;
    n: number;
    lowPower: boolean;
    tooFewFor: TestKind[];
    /** The reduced levels of its finds in scope (m above the site datum), summarised; null levels counted apart. */
    vertical: VerticalSpread;
  }[];
  totalFinds: number;
  /** The site's threshold for the vertical-spread caution (m), and whether it is the common-practice default. */
  spreadCaution: { threshold: number; isDefault: boolean };
  /** The depth limits and what they left out; null when the scope takes whole contexts. */
  depth: ScopeDepthSummary | null;
  warnings: StratWarning[];
  defaults: { correction: string; rmax: number; nsim: number; level: number };
  minPoints: Record<TestKind, number>;
  fingerprint: string;
};

/** The depth limits of a scope (level range, spits) and the finds they left out. */
export type ScopeDepthSummary = {
  levelFrom: number | null;
  levelTo: number | null;
  /** Chosen spits named "context/spit", e.g. "1005/2", with their levels. */
  spits: { id: string; label: string; topLevel: number | null; baseLevel: number | null }[];
  /** Finds left out of a level range because they have no level: how many, and their numbers. */
  noLevel: { count: number; numbers: number[] };
  /** Finds left out of a choice of spits because they were recorded in no spit. */
  noSpit: { count: number; numbers: number[] };
};
