import type { ApiOperation } from "./types";

/** API operations of distribution-test runs. */
export const patternsApi = {} satisfies Record<string, ApiOperation>;
