import { fileTypeFromBuffer } from 'file-type';
import { imageSize } from 'image-size';
import { HttpError } from '../errors';
import {
  ACCEPTED_IMAGES_SENTENCE,
  ACCEPTED_IMAGE_TYPES,
  MAX_IMAGE_PIXELS,
  MAX_IMAGE_SIDE,
  type AcceptedImageType,
} from '../../shared/uploads';

const SIZE_TYPE: Record<AcceptedImageType, string> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
};

export interface CheckedImage {
  type: AcceptedImageType;
  width: number;
  height: number;
}

/**
 * Decides what a file is by its content (never its name or the browser's claim) and
 * reads its pixel dimensions from the header, without decoding it. Cheap enough for the
 * request thread: only the first bytes and the header segments are looked at.
 * Throws 415 for anything but JPEG, PNG and WebP, 413 for too many pixels, 400 for a
 * header that cannot be read.
 */
export async function checkImage(buf: Buffer): Promise<CheckedImage> {
  if (buf.length === 0)
    throw new HttpError(400, 'EMPTY_FILE', `The file is empty. ${ACCEPTED_IMAGES_SENTENCE}`);
  const detected = await fileTypeFromBuffer(buf).catch(() => undefined);
  // An animated PNG is a PNG whose first frame is the still image.
  const mime = detected?.mime === 'image/apng' ? 'image/png' : detected?.mime;
  if (!mime || !(ACCEPTED_IMAGE_TYPES as readonly string[]).includes(mime)) {
    const what = detected
      ? `its content is ${detected.mime}`
      : 'its content is not an image we recognise';
    throw new HttpError(
      415,
      'UNSUPPORTED_TYPE',
      `This file cannot be used: ${what}. ${ACCEPTED_IMAGES_SENTENCE}`,
    );
  }
  const type = mime as AcceptedImageType;

  let width: number | undefined;
  let height: number | undefined;
  try {
    const size = imageSize(buf);
    if (size.type !== SIZE_TYPE[type]) throw new Error('type mismatch');
    ({ width, height } = size);
  } catch {
    width = undefined;
  }
  if (!width || !height)
    throw new HttpError(
      400,
      'BROKEN_IMAGE',
      'The image header could not be read: the file may be damaged or cut short. Export it again and retry.',
    );
  if (width > MAX_IMAGE_SIDE || height > MAX_IMAGE_SIDE || width * height > MAX_IMAGE_PIXELS)
    throw new HttpError(
      413,
      'TOO_MANY_PIXELS',
      `The image is ${width} × ${height} pixels, more than we accept. ${ACCEPTED_IMAGES_SENTENCE} Scale it down and try again.`,
    );
  return { type, width, height };
}
