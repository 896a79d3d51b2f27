import { z } from "zod";

/** A control point as the plan sends it: a pixel of the display photo and its site-grid position. */
export const controlPointSchema = z.object({
  px: z.coerce.number().finite("A photo position must be a number of pixels."),
  py: z.coerce.number().finite("A photo position must be a number of pixels."),
  x: z.coerce.number({ error: "Enter the grid easting in metres." }).finite("Enter a finite number of metres.").refine((v) => Math.abs(v) < 1e7, "That coordinate is implausibly far from the site grid origin."),
  y: z.coerce.number({ error: "Enter the grid northing in metres." }).finite("Enter a finite number of metres.").refine((v) => Math.abs(v) < 1e7, "That coordinate is implausibly far from the site grid origin."),
});

export const photoFitInputSchema = z.object({
  points: z.array(controlPointSchema).min(2, "A fit needs at least 2 control points.").max(50, "Use at most 50 control points."),
  /** Leave out to let the number of points choose (2 similarity, 3 affine, 4+ projective). */
  model: z.enum(["similarity", "affine", "projective"]).optional(),
});

export const photoListQuery = z.object({ trenchId: z.string().uuid().optional() });

export const photoVariants = ["display", "thumb", "warp"] as const;

export type PhotoFitInput = z.infer<typeof photoFitInputSchema>;

/** What the plan reads of one photo. */
export type PhotoView = {
  id: string;
  trenchId: string | null;
  fileName: string;
  width: number | null;
  height: number | null;
  displayUrl: string;
  thumbUrl: string;
  createdAt: string;
  fit: StoredFit | null;
};

export type StoredFit = {
  model: "similarity" | "affine" | "projective";
  points: z.infer<typeof controlPointSchema>[];
  matrix: number[];
  residuals: number[];
  rms: number;
  redundancy: number;
  fittedAt: string;
  fittedBy: string;
  /** Projective fits only: a north-up raster made on the server, drawn at these grid bounds. */
  warp?: { url: string; minX: number; minY: number; maxX: number; maxY: number; width: number; height: number };
};
