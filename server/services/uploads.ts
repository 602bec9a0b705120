import crypto from 'node:crypto';
import { col, Op, where } from 'sequelize';
import type { AppContext } from '../context';
import { HttpError, notFound } from '../errors';
import { hasRole } from '../http/access';
import { Document } from '../models/Document';
import {
  Upload,
  type StoredImageType,
  type UploadVariant,
  type UploadVariants,
} from '../models/Upload';
import { ImagePoolError } from '../workers/imagePool';
import type { EncodedImage } from '../workers/imageTasks';
import type { Annotation } from '../../shared/schemas/annotations';
import { ACCEPTED_IMAGES_SENTENCE } from '../../shared/uploads';
import { checkImage } from './imageCheck';
import { inPublishedWriteup } from './writeups';

export type VariantName = keyof UploadVariants;

/** What the API shows of an upload. */
export interface UploadView {
  id: string;
  url: string;
  thumbUrl: string;
  width: number;
  height: number;
  contentType: StoredImageType;
  bytes: number;
  originalName: string;
  documentId: number | null;
  createdAt: Date;
}

/** The API shape of an upload: `url` is the web copy, `thumbUrl` the thumbnail. */
export function uploadView(u: Upload): UploadView {
  return {
    id: u.publicId,
    url: `/api/uploads/${u.publicId}`,
    thumbUrl: `/api/uploads/${u.publicId}/thumb`,
    width: u.width,
    height: u.height,
    contentType: u.contentType,
    bytes: u.bytes,
    originalName: u.originalName,
    documentId: u.documentId,
    createdAt: u.createdAt,
  };
}

const EXT: Record<StoredImageType, string> = { 'image/jpeg': 'jpg', 'image/png': 'png' };

/**
 * Reduces an uploaded file name to a harmless base name for display and for the
 * Content-Disposition header: no directories, no control characters, ASCII only, the
 * extension of what is actually stored. It never becomes a path on disk.
 */
export function safeFileName(name: string | undefined, type?: StoredImageType): string {
  const base = (name ?? '').split(/[/\\]/).pop() ?? '';
  let stem = base
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/\.[A-Za-z0-9]{1,5}$/, '')
    .replace(/[^A-Za-z0-9._ ()-]+/g, '_')
    .replace(/^[._ ]+/, '')
    .replace(/_+/g, '_')
    .trim()
    .slice(0, 100);
  if (!stem || stem === '_') stem = 'image';
  return type ? `${stem}.${EXT[type]}` : stem;
}

const locks = new Map<string, Promise<void>>();

/** Runs `fn` with nothing else in this process touching the same content key. */
async function withKeyLock<T>(key: string, fn: () => Promise<T>): Promise<T> {
  const previous = locks.get(key) ?? Promise.resolve();
  let release!: () => void;
  const mine = previous.then(() => new Promise<void>((r) => (release = r)));
  locks.set(key, mine);
  await previous;
  try {
    return await fn();
  } finally {
    release();
    if (locks.get(key) === mine) locks.delete(key);
  }
}

function sha256(buf: Buffer) {
  return crypto.createHash('sha256').update(buf).digest('hex');
}

function poolError(err: unknown, ctx: AppContext): never {
  if (err instanceof ImagePoolError) {
    if (err.kind === 'busy' || err.kind === 'closed')
      throw new HttpError(
        503,
        'BUSY',
        'Many images are being processed right now. Please try again in a minute; nothing was saved.',
      );
    if (err.kind === 'timeout')
      throw new HttpError(
        422,
        'IMAGE_TOO_COMPLEX',
        'The image took too long to process. Try a smaller copy of it; nothing was saved.',
      );
    ctx.logger.error({ err }, 'image worker failed');
    throw new HttpError(
      422,
      'IMAGE_TOO_COMPLEX',
      'The image could not be processed within the memory we allow for one image. Try a smaller copy of it; nothing was saved.',
    );
  }
  throw err;
}

function storageError(err: unknown, ctx: AppContext): never {
  ctx.logger.error({ err }, 'could not store an image');
  throw new HttpError(
    503,
    'STORAGE_UNAVAILABLE',
    'The image could not be stored right now. Please try again later; nothing was saved.',
  );
}

async function keyInUse(key: string): Promise<boolean> {
  return (await Upload.count({ where: where(col('variants'), Op.like, `%"${key}"%`) })) > 0;
}

function variantOf(img: EncodedImage, name: VariantName): { variant: UploadVariant; data: Buffer } {
  const data = Buffer.from(img.data.buffer, img.data.byteOffset, img.data.byteLength);
  const key = `${sha256(data)}-${name}.${EXT[img.contentType]}`;
  return {
    data,
    variant: {
      key,
      contentType: img.contentType,
      width: img.width,
      height: img.height,
      bytes: data.length,
    },
  };
}

/**
 * Checks, re-encodes and stores an uploaded image for `ownerId`. The type and pixel
 * count are checked from the content and header first (415/413/400); decoding runs in
 * the image workers. Only the re-encoded web copy and thumbnail are kept, by content
 * hash. On any failure nothing is left: no row, and no file that no row refers to.
 */
export async function createUpload(
  ctx: AppContext,
  ownerId: number,
  file: { buffer: Buffer; originalname?: string },
): Promise<Upload> {
  const checked = await checkImage(file.buffer);
  const result = await ctx.images
    .process(file.buffer, checked.type, checked.width * checked.height)
    .catch((err) => poolError(err, ctx));
  if (!result.ok) {
    if (result.reason === 'too-large')
      throw new HttpError(413, 'TOO_MANY_PIXELS', `${result.message} ${ACCEPTED_IMAGES_SENTENCE}`);
    throw new HttpError(400, 'BROKEN_IMAGE', `${result.message} Export it again and retry.`);
  }
  const web = variantOf(result.web, 'web');
  const thumb = variantOf(result.thumb, 'thumb');
  const contentType = result.web.contentType;

  return withKeyLock(web.variant.key, async () => {
    const created: string[] = [];
    try {
      for (const v of [web, thumb]) {
        const { created: isNew } = await ctx.storage
          .put(v.variant.key, v.data, v.variant.contentType)
          .catch((err) => storageError(err, ctx));
        if (isNew) created.push(v.variant.key);
      }
      return await Upload.create({
        publicId: crypto.randomUUID(),
        ownerId,
        documentId: null,
        status: 'ready',
        sha256: web.variant.key.slice(0, 64),
        contentType,
        width: web.variant.width,
        height: web.variant.height,
        bytes: web.variant.bytes,
        variants: { web: web.variant, thumb: thumb.variant },
        originalName: safeFileName(file.originalname, contentType),
      });
    } catch (err) {
      for (const key of created) {
        if (!(await keyInUse(key).catch(() => true)))
          await ctx.storage.delete(key).catch(() => undefined);
      }
      throw err;
    }
  });
}

const PUBLIC_ID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

/** Whether the document an upload is attached to has a published revision. */
async function documentIsPublished(documentId: number): Promise<boolean> {
  const doc = await Document.findByPk(documentId, { attributes: ['id', 'publishedRevisionId'] });
  return doc?.publishedRevisionId != null;
}

/**
 * Who may see an upload: its uploader and moderators always; anyone else only once
 * the document it is attached to has a published revision, or once the published
 * revision of one of the uploader's write-ups shows it. Extend here (not in the
 * routes) when documents grow other readers.
 */
export async function canReadUpload(
  user: Express.User | undefined,
  upload: Upload,
): Promise<boolean> {
  if (user && (user.id === upload.ownerId || hasRole(user.role, 'moderator'))) return true;
  if (upload.documentId != null && (await documentIsPublished(upload.documentId))) return true;
  return inPublishedWriteup(upload);
}

/**
 * The upload behind a public id, if `user` may see it. Unknown ids and uploads the
 * user may not see answer the same 404, so ids cannot be probed.
 */
export async function findReadableUpload(
  user: Express.User | undefined,
  publicId: string,
): Promise<Upload> {
  const missing = notFound('There is no image at this address, or it is not shared with you.');
  if (!PUBLIC_ID.test(publicId)) throw missing;
  const upload = await Upload.findOne({ where: { publicId } });
  if (!upload || upload.status !== 'ready' || !(await canReadUpload(user, upload))) throw missing;
  return upload;
}

/** Opens one stored copy of an upload for streaming. */
export async function openVariant(ctx: AppContext, upload: Upload, name: VariantName) {
  const variant = upload.variants[name];
  const blob = await ctx.storage.get(variant.key);
  if (!blob) {
    ctx.logger.error({ upload: upload.publicId, key: variant.key }, 'stored image is missing');
    throw notFound('This image is missing from storage. Ask its author to upload it again.');
  }
  return { ...blob, variant, fileName: safeFileName(upload.originalName, variant.contentType) };
}

/**
 * Draws annotations over an upload's web copy, for a download (printing, sharing).
 * Rendered in the image workers like every other decode.
 */
export async function flattenUpload(ctx: AppContext, upload: Upload, annotations: Annotation[]) {
  const variant = upload.variants.web;
  const data = await ctx.storage.getBuffer(variant.key);
  if (!data)
    throw notFound('This image is missing from storage. Ask its author to upload it again.');
  const result = await ctx.images
    .flatten(data, variant.contentType, annotations, variant.width * variant.height)
    .catch((err) => poolError(err, ctx));
  if (!result.ok) {
    ctx.logger.error(
      { upload: upload.publicId, reason: result.message },
      'stored image could not be decoded',
    );
    throw new HttpError(
      422,
      'BROKEN_IMAGE',
      'This image could not be drawn on. Ask its author to upload it again.',
    );
  }
  const stem = safeFileName(upload.originalName);
  return {
    data: Buffer.from(result.data.buffer, result.data.byteOffset, result.data.byteLength),
    contentType: result.contentType,
    fileName: `${stem}-annotated.${EXT[result.contentType]}`,
  };
}
