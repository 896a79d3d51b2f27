import { requestPasswordReset, resetRequestSchema } from "@/lib/server/password-reset";
import { publicRoute } from "../../public-route";

/** Always answers 200 the same way, whether or not the address has an account. */
export const POST = publicRoute(resetRequestSchema, (db, input) => requestPasswordReset(db, input.email));
