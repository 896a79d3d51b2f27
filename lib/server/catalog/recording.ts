import type { ApiOperation } from "./types";

/** API operations of context relations, the matrix, the finds register, imports and exports. */
export const recordingApi = {} satisfies Record<string, ApiOperation>;
