import { handlers } from "@/auth";
import { withBodyLimit } from "@/lib/server/http";

/** Sign-in and sign-out forms are a few hundred bytes; nothing larger is read before the session exists. */
const AUTH_BODY_LIMIT = 16 * 1024;

export const GET = handlers.GET;
export const POST = withBodyLimit(AUTH_BODY_LIMIT, handlers.POST);
