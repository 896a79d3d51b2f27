import { photoFitInputSchema, photoListQuery } from "@/lib/geometry/photo-fit-input";
import { z } from "zod";
import { recorders, type ApiOperation } from "../operation";
import { photoView } from "../responses";

/**
 * API operations of the trench plan: photos, photo fit, photo files. Uploads themselves go through the
 * uploadthing route (/api/uploadthing), whose middleware applies the same role rule (recorders).
 */
export const planApi = {
  photosList: {
    method: "GET",
    path: "/api/sites/{siteId}/photos",
    summary: "Plan photos (optionally of one trench), with their fits",
    roles: "member",
    input: photoListQuery,
    from: "query",
    response: z.array(photoView),
  },
  photoRead: {
    method: "GET",
    path: "/api/sites/{siteId}/photos/{photoId}",
    summary: "One plan photo with its fit",
    roles: "member",
    from: "none",
  },
  photoFit: {
    method: "POST",
    path: "/api/sites/{siteId}/photos/{photoId}/fit",
    summary: "Fit a photo to the site grid from control points",
    roles: recorders,
    doing: "fit plan photos",
    input: photoFitInputSchema,
    response: photoView,
  },
  photoDelete: {
    method: "DELETE",
    path: "/api/sites/{siteId}/photos/{photoId}",
    summary: "Delete a plan photo and its derivatives",
    roles: recorders,
    doing: "delete plan photos",
    from: "none",
  },
  photoFile: {
    method: "GET",
    path: "/api/files/{siteId}/{photoId}/{variant}",
    summary: "A photo derivative (display, thumb, warp) or the uploaded original, for members of its site only",
    roles: "member",
    from: "none",
  },
} as const satisfies Record<string, ApiOperation>;
