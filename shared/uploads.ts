/**
 * What the upload route accepts, shared so the upload screen can say it before sending.
 * The server decides by the file's content, never by its name or the browser's claim.
 */

/** Image types recognised by content. WebP is decoded and re-encoded as JPEG or PNG. */
export const ACCEPTED_IMAGE_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export type AcceptedImageType = (typeof ACCEPTED_IMAGE_TYPES)[number];

/** A file must be smaller than this (15 MB). */
export const MAX_UPLOAD_BYTES = 15_000_000;
/** Pixel count and side length read from the header, refused before any decoding. */
export const MAX_IMAGE_PIXELS = 40_000_000;
export const MAX_IMAGE_SIDE = 12_000;
/** Long side of the web copy and of the thumbnail. Smaller images are not enlarged. */
export const WEB_MAX_SIDE = 1600;
export const THUMB_MAX_SIDE = 320;

/** One sentence naming what is accepted, for error messages and the upload screen. */
export const ACCEPTED_IMAGES_SENTENCE =
  'Upload a photo or drawing as JPEG, PNG or WebP, smaller than 15 MB and at most 40 megapixels (12 000 pixels a side).';
