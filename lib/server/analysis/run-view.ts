import type { RunResult } from "./result-types";
import type { RunScope, RunTest, SquareTest } from "./run-schema";
import type { StratWarning } from "./stratigraphy";

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
