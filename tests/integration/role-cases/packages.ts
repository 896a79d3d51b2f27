import * as packagesRoute from "@/app/api/sites/[siteId]/packages/route";
import type { RoleCases } from "./types";

/** Mutating operations of the deposition package job. */
export const packagesCases: RoleCases = {
  packagesCreate: async (fx) => ({ mod: packagesRoute, params: { siteId: fx.site.id }, body: {} }),
};
