import { createRouteHandler } from "uploadthing/next";
import { uploadRouter } from "@/lib/server/uploads/file-router";

/**
 * The uploadthing route: the SDK answers presigned URLs after the router's middleware (auth, role,
 * type and size) and receives the service's upload-complete callback. Configuration comes from the
 * UPLOADTHING_* environment variables (local-services.md).
 */
export const { GET, POST } = createRouteHandler({ router: uploadRouter });
