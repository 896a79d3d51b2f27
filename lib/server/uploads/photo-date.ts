import "server-only";
import exifr from "exifr";

export type TakenAt = { at: Date; source: "camera" | "upload" };

/** "2026:07:14 09:30:05" as EXIF writes DateTimeOriginal; the offset tag ("+02:00") when the camera wrote one. */
const EXIF_STAMP = /^(\d{4}):(\d{2}):(\d{2})[ T](\d{2}):(\d{2}):(\d{2})/;
const OFFSET = /^[+-]\d{2}:\d{2}$/;

/**
 * When the photo was taken: the camera's DateTimeOriginal (EXIF 2.3, tag 0x9003) when the file carries
 * one, read with exifr; otherwise the moment of the upload, and said so. EXIF stamps are the camera's clock
 * without a zone unless OffsetTimeOriginal (0x9011) gives one; without it the stamp is read as UTC, the one
 * zone Loamwork shows.
 */
export async function photoTakenAt(bytes: Buffer, uploadedAt = new Date()): Promise<TakenAt> {
  let tags: { DateTimeOriginal?: unknown; OffsetTimeOriginal?: unknown } | undefined;
  try {
    tags = await exifr.parse(bytes, {
      pick: ["DateTimeOriginal", "OffsetTimeOriginal"],
      reviveValues: false,
    });
  } catch {
    tags = undefined;
  }
  const stamp = typeof tags?.DateTimeOriginal === "string" ? EXIF_STAMP.exec(tags.DateTimeOriginal) : null;
  if (stamp) {
    const offset = typeof tags?.OffsetTimeOriginal === "string" ? tags.OffsetTimeOriginal.trim() : "";
    const [, y, mo, d, h, mi, s] = stamp;
    const at = new Date(`${y}-${mo}-${d}T${h}:${mi}:${s}${OFFSET.test(offset) ? offset : "Z"}`);
    // A camera that never had its clock set writes 0000:00:00; such a stamp says nothing.
    if (!Number.isNaN(at.getTime()) && at.getUTCFullYear() >= 1900 && at.getTime() <= uploadedAt.getTime() + 86_400_000)
      return { at, source: "camera" };
  }
  return { at: uploadedAt, source: "upload" };
}
