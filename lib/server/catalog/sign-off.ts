import type { ApiOperation } from "./types";

/** API operations of sign-off, reopening, audit, invitations, mail. */
export const signOffApi = {} satisfies Record<string, ApiOperation>;
