import { confirmPasswordReset, resetConfirmSchema } from "@/lib/server/password-reset";
import { publicRoute } from "../../public-route";

export const POST = publicRoute(resetConfirmSchema, (db, input) => confirmPasswordReset(db, input));
