import { api } from "@/lib/server/api-catalog";
import { publicRoute } from "@/lib/server/http";
import { confirmPasswordReset } from "@/lib/server/password-reset";

export const POST = publicRoute(api.passwordResetConfirm, (ctx) => confirmPasswordReset(ctx.db, ctx.input));
