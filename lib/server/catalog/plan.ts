import type { ApiOperation } from "./types";

/** API operations of the trench plan: photos, photo fit, outline editing (issue: trench plan). */
export const planApi = {} satisfies Record<string, ApiOperation>;
