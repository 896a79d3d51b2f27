import { createRouteHandler } from "uploadthing/next";
import { withBodyLimit } from "@/lib/server/http";
import { uploadRouter } from "@/lib/server/uploads/file-router";

/**
 * The uploadthing route: the SDK answers presigned URLs after the router's middleware (auth, role,
 * type and size) and receives the service's upload-complete callback. Configuration comes from the
 * UPLOADTHING_* environment variables (local-services.md). The files themselves go to the upload service,
 * never through this route: its bodies are small JSON (file names and sizes, the signed callback).
 */
const handlers = createRouteHandler({ router: uploadRouter });
const UPLOAD_ROUTE_BODY_LIMIT = 64 * 1024;

export const GET = handlers.GET;
export const POST = withBodyLimit(UPLOAD_ROUTE_BODY_LIMIT, handlers.POST);
