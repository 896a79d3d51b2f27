import "server-only";
import sharp from "sharp";
import { badInput } from "../errors";

/** Longest side of the display derivative: enough to place finds at 2–3 mm over a 5 m trench. */
export const DISPLAY_PX = 2560;
export const THUMB_PX = 320;
/** Formats sharp reads that a site camera or phone produces. */
export const PHOTO_FORMATS = ["jpeg", "png", "webp", "tiff", "heif", "avif"] as const;

export type Derivatives = { display: Buffer; thumb: Buffer; width: number; height: number; format: string };

/**
 * Display and thumbnail JPEGs with the EXIF orientation applied (`rotate()` with no angle reads the
 * Orientation tag), so control points are picked on the photo as the camera saw it.
 */
export async function makeDerivatives(bytes: Buffer): Promise<Derivatives> {
  let format: string | undefined;
  try {
    format = (await sharp(bytes).metadata()).format;
  } catch {
    throw badInput("The uploaded file is not an image Loamwork can read (JPEG, PNG, WebP, TIFF, HEIF or AVIF).");
  }
  if (!format || !(PHOTO_FORMATS as readonly string[]).includes(format)) {
    throw badInput(
      `The uploaded file is a ${format ?? "unknown"} image; Loamwork takes JPEG, PNG, WebP, TIFF, HEIF or AVIF photos.`,
    );
  }
  const oriented = sharp(bytes, { failOn: "error" }).rotate();
  const display = await oriented
    .clone()
    .resize({ width: DISPLAY_PX, height: DISPLAY_PX, fit: "inside", withoutEnlargement: true })
    .jpeg({ quality: 85, mozjpeg: true })
    .toBuffer({ resolveWithObject: true });
  const thumb = await oriented
    .clone()
    .resize({ width: THUMB_PX, height: THUMB_PX, fit: "inside" })
    .jpeg({ quality: 75 })
    .toBuffer();
  return { display: display.data, thumb, width: display.info.width, height: display.info.height, format };
}
