import { api } from "@/lib/server/api-catalog";
import { deleteBenchmark, updateBenchmark } from "@/lib/server/benchmarks";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const PATCH = guardedRoute(api.benchmarkUpdate, (ctx) =>
  updateBenchmark(ctx.db, siteActor(ctx), ctx.params.benchmarkId!, ctx.input),
);
export const DELETE = guardedRoute(api.benchmarkDelete, (ctx) =>
  deleteBenchmark(ctx.db, siteActor(ctx), ctx.params.benchmarkId!),
);
