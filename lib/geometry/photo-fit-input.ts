import { z } from "zod";
import { numeric } from "@/lib/schemas/common";

const pixel = numeric(
  z
    .number({ error: "A photo position must be a number of pixels." })
    .finite("A photo position must be a number of pixels."),
);
const gridMetres = (error: string) =>
  numeric(
    z
      .number({ error })
      .finite("Enter a finite number of metres.")
      .refine((v) => Math.abs(v) < 1e7, "That coordinate is implausibly far from the site grid origin."),
  );

/** A control point as the plan sends it: a pixel of the display photo and its site-grid position. */
export const controlPointSchema = z.object({
  px: pixel,
  py: pixel,
  x: gridMetres("Enter the grid easting in metres."),
  y: gridMetres("Enter the grid northing in metres."),
});

export const photoFitInputSchema = z.object({
  points: z
    .array(controlPointSchema)
    .min(2, "A fit needs at least 2 control points.")
    .max(50, "Use at most 50 control points."),
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
