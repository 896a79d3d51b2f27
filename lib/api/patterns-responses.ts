import type { RunResult } from "./run-result";
import type { RunScope, RunTest, SquareTest, TestKind } from "@/lib/schemas/run";
import type { StratWarning } from "@/lib/stratigraphy/one-surface";

/** A run as the API returns it. `outOfDate` is computed on read from the fingerprint. Types only. */
export type RunParamsStored = {
  correction: "isotropic" | "translation" | "border";
  rmax: number;
  nsim: number;
  level: number;
  tests: RunTest[];
  /** Tests on counts by grid square (absent in runs stored before they existed). */
  squareTests?: SquareTest[];
  label?: string;
  /** Names at the time of the run, for lists. */
  names: { trench: string; contexts: number[]; classes: string[] };
  warnings: StratWarning[];
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
  }[];
  totalFinds: number;
  warnings: StratWarning[];
  defaults: { correction: string; rmax: number; nsim: number; level: number };
  minPoints: Record<TestKind, number>;
  fingerprint: string;
};
