import { emptyQuery } from "@/lib/schemas/common";
import { archiveApi } from "./catalog/archive";
import { coreApi } from "./catalog/core";
import { levelsApi } from "./catalog/levels";
import { offlineApi } from "./catalog/offline";
import { packagesApi } from "./catalog/packages";
import { patternsApi } from "./catalog/patterns";
import { planApi } from "./catalog/plan";
import { publicApi } from "./catalog/public";
import { recordingApi } from "./catalog/recording";
import { signOffApi } from "./catalog/sign-off";
import { squaresApi } from "./catalog/squares";

export type { ApiOperation } from "./operation";

/**
 * Every JSON API operation in one table: its path, who may call it, the zod schema of its input and of the
 * answer a screen reads. The route handlers, the OpenAPI document, the role × write test and the browser's
 * fetch layer (lib/api/client.ts) all read this table, so a new route cannot skip any of them. Each feature
 * keeps its operations in lib/api/catalog/<feature>.ts. Pure data: no server code is imported here.
 */
export const api = {
  ...coreApi,
  ...planApi,
  ...recordingApi,
  ...signOffApi,
  ...patternsApi,
  ...levelsApi,
  ...squaresApi,
  ...archiveApi,
  ...packagesApi,
  ...offlineApi,
  ...publicApi,
};

export type ApiName = keyof typeof api;
export const noInput = emptyQuery;
