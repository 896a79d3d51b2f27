import { api } from "@/lib/server/api-catalog";
import { publicRoute } from "@/lib/server/http";
import { requestPasswordReset } from "@/lib/server/password-reset";

/** Always answers 200 the same way, whether or not the address has an account. */
export const POST = publicRoute(api.passwordResetRequest, (ctx) => requestPasswordReset(ctx.db, ctx.input.email));
