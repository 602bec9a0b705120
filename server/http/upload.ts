import type { NextFunction, Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import { HttpError } from '../errors';
import { ACCEPTED_IMAGES_SENTENCE, MAX_UPLOAD_BYTES } from '../../shared/uploads';

/**
 * Admits at most `limit` requests at a time and queues up to `maxWaiting` more. A
 * queued request's body is not read yet, so waiting costs a socket, not memory; past
 * the queue the answer is 503 at once.
 */
export class Gate {
  private active = 0;
  private readonly waiting: Array<() => void> = [];

  constructor(
    readonly limit: number,
    readonly maxWaiting: number,
  ) {}

  /** Admits the request or queues it; the slot is freed when the response ends. */
  middleware(): RequestHandler {
    return (_req: Request, res: Response, next: NextFunction) => {
      let state: 'waiting' | 'active' | 'done' = 'waiting';
      const release = () => {
        if (state === 'active') {
          state = 'done';
          this.active--;
          this.waiting.shift()?.();
        } else if (state === 'waiting') {
          state = 'done';
          const i = this.waiting.indexOf(admit);
          if (i >= 0) this.waiting.splice(i, 1);
        }
      };
      const admit = () => {
        if (state !== 'waiting') return;
        state = 'active';
        this.active++;
        next();
      };
      res.once('finish', release);
      res.once('close', release);
      if (this.active < this.limit) return admit();
      if (this.waiting.length >= this.maxWaiting) {
        state = 'done';
        res.setHeader('Retry-After', '10');
        return next(
          new HttpError(
            503,
            'BUSY',
            'Many images are being uploaded right now. Please try again in a minute.',
          ),
        );
      }
      this.waiting.push(admit);
    };
  }

  stats() {
    return { active: this.active, waiting: this.waiting.length };
  }
}

const upload = multer({
  storage: multer.memoryStorage(),
  limits: {
    // multer's limit is inclusive; ours is "smaller than 15 MB".
    fileSize: MAX_UPLOAD_BYTES - 1,
    files: 1,
    fields: 4,
    parts: 5,
    fieldSize: 1024,
    fieldNameSize: 64,
    headerPairs: 50,
  },
});

const MULTER_MESSAGES: Record<string, [number, string, string]> = {
  LIMIT_FILE_SIZE: [413, 'TOO_LARGE', `The file is too large: send an image smaller than 15 MB.`],
  LIMIT_FILE_COUNT: [400, 'TOO_MANY_FILES', 'Send one image per request.'],
  LIMIT_UNEXPECTED_FILE: [
    400,
    'UNEXPECTED_FIELD',
    'Send the image in the form field "file", one image per request.',
  ],
  LIMIT_PART_COUNT: [
    400,
    'TOO_MANY_PARTS',
    'The form has too many parts: send only the image in the field "file".',
  ],
  LIMIT_FIELD_COUNT: [
    400,
    'TOO_MANY_FIELDS',
    'The form has too many fields: send only the image in the field "file".',
  ],
  LIMIT_FIELD_KEY: [400, 'BAD_FORM', 'A form field name is too long.'],
  LIMIT_FIELD_VALUE: [400, 'BAD_FORM', 'A form field is too long.'],
};

/**
 * Reads one image from the multipart field `file` into memory, with every multer limit
 * set. Errors become sentences; a request without a file is refused here.
 */
export function receiveImage(): RequestHandler {
  const single = upload.single('file');
  return (req, res, next) => {
    if (!req.is('multipart/form-data'))
      return next(
        new HttpError(
          415,
          'NOT_MULTIPART',
          `Send the image as multipart/form-data in the field "file". ${ACCEPTED_IMAGES_SENTENCE}`,
        ),
      );
    single(req, res, (err?: unknown) => {
      if (err) {
        const code = (err as { code?: string }).code;
        const known = err instanceof multer.MulterError && code ? MULTER_MESSAGES[code] : undefined;
        if (known) return next(new HttpError(known[0], known[1], known[2]));
        return next(
          new HttpError(
            400,
            'BAD_FORM',
            'The upload could not be read: the form data is incomplete or malformed.',
          ),
        );
      }
      if (!req.file)
        return next(
          new HttpError(
            400,
            'NO_FILE',
            `Choose an image to upload (form field "file"). ${ACCEPTED_IMAGES_SENTENCE}`,
          ),
        );
      next();
    });
  };
}
