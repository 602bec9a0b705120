import { pipeline } from 'node:stream/promises';
import { Router, type Request, type Response } from 'express';
import { RateLimiterMemory } from 'rate-limiter-flexible';
import type { AppContext } from '../context';
import { HttpError } from '../errors';
import { allow } from '../http/access';
import { Gate, receiveImage } from '../http/upload';
import { parseWith } from '../http/validate';
import { flattenBodySchema } from '../../shared/schemas/annotations';
import {
  createUpload,
  findReadableUpload,
  flattenUpload,
  openVariant,
  uploadView,
  type VariantName,
} from '../services/uploads';

/** Headers that keep a stored image from ever being treated as a page or script. */
function imageHeaders(res: Response, contentType: string, disposition: string) {
  res.setHeader('Content-Type', contentType);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
  res.setHeader('Content-Disposition', disposition);
  res.setHeader('Cross-Origin-Resource-Policy', 'same-origin');
}

/** `/api/uploads`: receive an image, serve its copies, and draw annotations onto it. */
export function uploadRoutes(ctx: AppContext) {
  const r = Router();
  // Eight uploads in memory at once (at most 15 MB each); the rest wait unread.
  const gate = new Gate(8, 256);
  const flattenLimit = new RateLimiterMemory({ points: 30, duration: 60, keyPrefix: 'flatten' });

  r.post('/', allow('verified'), gate.middleware(), receiveImage(), async (req, res) => {
    const upload = await createUpload(ctx, req.user!.id, req.file!);
    const view = uploadView(upload);
    res.status(201).location(view.url).json(view);
  });

  const serve = (name: VariantName) => async (req: Request, res: Response) => {
    const upload = await findReadableUpload(req.user, String(req.params.id));
    const blob = await openVariant(ctx, upload, name);
    imageHeaders(res, blob.variant.contentType, `inline; filename="${blob.fileName}"`);
    // Private: who may see it depends on the session. The bytes under a URL never change.
    res.setHeader('Cache-Control', 'private, max-age=3600');
    res.setHeader('ETag', `"${blob.variant.key.slice(0, 64)}"`);
    if (req.fresh) {
      blob.stream.destroy();
      res.status(304).end();
      return;
    }
    res.setHeader('Content-Length', String(blob.size));
    if (req.method === 'HEAD') {
      blob.stream.destroy();
      res.end();
      return;
    }
    await pipeline(blob.stream, res).catch(() => undefined);
  };

  r.get('/:id', allow('anyone'), serve('web'));
  r.get('/:id/thumb', allow('anyone'), serve('thumb'));

  r.post('/:id/flatten', allow('anyone'), async (req, res) => {
    const upload = await findReadableUpload(req.user, String(req.params.id));
    const { annotations } = parseWith(flattenBodySchema, req.body);
    const who = req.user ? `u${req.user.id}` : `ip${req.ip}`;
    const allowed = await flattenLimit.consume(who).then(
      () => true,
      () => false,
    );
    if (!allowed)
      throw new HttpError(
        429,
        'THROTTLED',
        'Too many annotated downloads in a short time. Please wait a minute.',
      );
    const out = await flattenUpload(ctx, upload, annotations);
    imageHeaders(res, out.contentType, `attachment; filename="${out.fileName}"`);
    res.setHeader('Cache-Control', 'no-store');
    res.status(200).send(out.data);
  });

  return r;
}
