/** The upload limit for one site photo, and the types the plan accepts (checked again by sharp). */
export const PHOTO_MAX_BYTES = 16 * 1024 * 1024;
export const PHOTO_TYPES = [
  "image/jpeg",
  "image/png",
  "image/webp",
  "image/tiff",
  "image/heic",
  "image/heif",
  "image/avif",
];
