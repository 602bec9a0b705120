import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { Jimp } from 'jimp';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';
import {
  exifWithGps,
  jpeg,
  jpegMarkers,
  png,
  pngClaiming,
  webp,
  withSegment,
} from '../helpers/images';
import { Upload } from '../../server/models/Upload';
import { Document } from '../../server/models/Document';
import { safeFileName } from '../../server/services/uploads';

let env: TestEnv;
let owner: Client;
let other: Client;
let moderator: Client;
let anonymous: Client;
let ownerId: number;

beforeAll(async () => {
  env = await createTestEnv();
  const o = await clientAs(env, 'member');
  owner = o.client;
  ownerId = o.user!.id;
  other = (await clientAs(env, 'member')).client;
  moderator = (await clientAs(env, 'moderator')).client;
  anonymous = (await clientAs(env, 'anonymous')).client;
});
afterAll(() => env.close());

function send(client: Client, data: Buffer, name: string, contentType?: string) {
  return client.agent
    .post('/api/uploads')
    .set('X-CSRF-Token', client.csrf)
    .attach('file', data, contentType ? { filename: name, contentType } : name);
}

/** Every file under the upload folder, temporary ones included. */
function storedFiles(): string[] {
  const root = env.ctx.config.uploadDir;
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
      const p = path.join(dir, e.name);
      if (e.isDirectory()) walk(p);
      else out.push(path.relative(root, p));
    }
  };
  walk(root);
  return out.sort();
}

/** Asserts that a refused upload left no row, no file and (optionally) never decoded. */
async function expectNothingStored(run: () => Promise<void>, opts: { decoded?: boolean } = {}) {
  const rows = await Upload.count();
  const files = storedFiles();
  const tasks = env.ctx.images.tasksStarted;
  await run();
  expect(await Upload.count()).toBe(rows);
  expect(storedFiles()).toEqual(files);
  if (opts.decoded === false)
    expect(env.ctx.images.tasksStarted, 'the image worker ran').toBe(tasks);
}

describe('POST /api/uploads', { timeout: 120_000 }, () => {
  it('answers 201 with the web copy and thumbnail, at most 1600 and 320 px, and serves them', async () => {
    const res = await send(owner, await jpeg(2000, 1000), 'fuse box.jpg');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ width: 1600, height: 800, contentType: 'image/jpeg' });
    expect(res.body.url).toBe(`/api/uploads/${res.body.id}`);
    expect(res.body.thumbUrl).toBe(`/api/uploads/${res.body.id}/thumb`);
    expect(res.headers.location).toBe(res.body.url);

    const web = await owner.get(res.body.url).buffer(true);
    expect(web.status).toBe(200);
    expect(web.headers['content-type']).toBe('image/jpeg');
    expect(web.headers['x-content-type-options']).toBe('nosniff');
    expect(web.headers['content-security-policy']).toBe("default-src 'none'; sandbox");
    expect(web.headers['content-disposition']).toBe('inline; filename="fuse box.jpg"');
    expect(web.headers['cache-control']).toMatch(/private/);
    const img = await Jimp.read(web.body as Buffer);
    expect([img.width, img.height]).toEqual([1600, 800]);

    const thumb = await owner.get(res.body.thumbUrl).buffer(true);
    expect(thumb.status).toBe(200);
    const t = await Jimp.read(thumb.body as Buffer);
    expect([t.width, t.height]).toEqual([320, 160]);

    const again = await owner.get(res.body.url).set('If-None-Match', web.headers.etag);
    expect(again.status).toBe(304);
  });

  it('does not enlarge a small image', async () => {
    const res = await send(owner, await png(200, 100), 'small.png');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ width: 200, height: 100 });
  });

  it('drops EXIF and its GPS position from a JPEG, after applying its orientation', async () => {
    const original = withSegment(await jpeg(600, 400, 3), 0xe1, exifWithGps(6));
    expect(jpegMarkers(original)).toContain(0xe1);
    expect(original.includes(Buffer.from('Exif\0\0'))).toBe(true);

    const res = await send(owner, original, 'IMG_0001.JPG');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // Orientation 6 is "rotate 90° clockwise": the stored copy is upright, so portrait.
    expect(res.body).toMatchObject({ width: 400, height: 600 });
    for (const url of [res.body.url, res.body.thumbUrl]) {
      const out = (await owner.get(url).buffer(true)).body as Buffer;
      expect(out.subarray(0, 2)).toEqual(Buffer.from([0xff, 0xd8]));
      const markers = jpegMarkers(out);
      expect(
        markers.filter((m) => m >= 0xe1 && m <= 0xef),
        'APP1..APP15 segments',
      ).toEqual([]);
      expect(out.includes(Buffer.from('Exif')), 'Exif header').toBe(false);
      expect(out.includes(Buffer.from('MM\0*')), 'TIFF header').toBe(false);
    }
  });

  it('stores a PNG named .jpg as PNG, by its content', async () => {
    const res = await send(owner, await png(300, 200), 'diagram.jpg', 'image/jpeg');
    expect(res.status).toBe(201);
    expect(res.body.contentType).toBe('image/png');
    const web = await owner.get(res.body.url).buffer(true);
    expect(web.headers['content-type']).toBe('image/png');
    expect(web.headers['content-disposition']).toBe('inline; filename="diagram.png"');
    expect((web.body as Buffer).subarray(1, 4).toString('latin1')).toBe('PNG');
  });

  it('accepts WebP by decoding it and stores it as JPEG (no transparency)', async () => {
    const res = await send(owner, await webp(500, 300), 'photo.webp');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ width: 500, height: 300, contentType: 'image/jpeg' });
  });

  it('re-encodes a polyglot (a JPEG with HTML appended) so the HTML is gone', async () => {
    const poly = Buffer.concat([
      await jpeg(120, 80),
      Buffer.from('<html><script>alert(1)</script></html>'),
    ]);
    const res = await send(owner, poly, 'poly.jpg');
    expect(res.status).toBe(201);
    const out = (await owner.get(res.body.url).buffer(true)).body as Buffer;
    expect(out.includes(Buffer.from('<script'))).toBe(false);
  });

  it.each([
    [
      'an HTML page named .png',
      '<!doctype html><html><body><script>alert(1)</script></body></html>',
    ],
    [
      'an SVG named .png',
      '<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><script>alert(2)</script><rect width="10" height="10"/></svg>',
    ],
    [
      'a GIF named .png',
      'GIF89a\x01\x00\x01\x00\x80\x00\x00\x00\x00\x00\xff\xff\xff,\x00\x00\x00\x00\x01\x00\x01\x00\x00\x02\x02D\x01\x00;',
    ],
    ['plain text', 'just some words'],
  ])('answers 415 with a sentence for %s, storing nothing', async (_what, content) => {
    await expectNothingStored(
      async () => {
        const res = await send(owner, Buffer.from(content, 'latin1'), 'harmless.png', 'image/png');
        expect(res.status).toBe(415);
        expect(res.body.error.code).toBe('UNSUPPORTED_TYPE');
        expect(res.body.error.message).toMatch(/JPEG, PNG or WebP/);
      },
      { decoded: false },
    );
  });

  it('refuses a 40 000 × 40 000 PNG header in a small file at once, before decoding', async () => {
    const bomb = pngClaiming(40_000, 40_000);
    expect(bomb.length).toBeLessThan(2000);
    await expectNothingStored(
      async () => {
        const t0 = performance.now();
        const res = await send(owner, bomb, 'bomb.png');
        const ms = performance.now() - t0;
        expect(res.status).toBe(413);
        expect(res.body.error.code).toBe('TOO_MANY_PIXELS');
        expect(res.body.error.message).toMatch(/40000 × 40000/);
        expect(ms).toBeLessThan(1000);
      },
      { decoded: false },
    );
  });

  it('refuses an image over 12 000 pixels a side even under 40 megapixels', async () => {
    const res = await send(owner, pngClaiming(13_000, 100), 'strip.png');
    expect(res.status).toBe(413);
  });

  it('answers 413 for a file of 15 MB, storing nothing', async () => {
    const big = Buffer.alloc(15_000_000, 0x41);
    (await jpeg(64, 64)).copy(big);
    await expectNothingStored(
      async () => {
        const res = await send(owner, big, 'huge.jpg');
        expect(res.status).toBe(413);
        expect(res.body.error.code).toBe('TOO_LARGE');
        expect(res.body.error.message).toMatch(/15 MB/);
      },
      { decoded: false },
    );
  });

  it('answers 400 for a truncated JPEG and a truncated PNG, storing nothing', async () => {
    const j = await jpeg(400, 300);
    const p = await png(400, 300);
    await expectNothingStored(async () => {
      for (const [data, name] of [
        [j.subarray(0, Math.floor(j.length * 0.6)), 'cut.jpg'],
        [p.subarray(0, Math.floor(p.length * 0.6)), 'cut.png'],
        [j.subarray(0, 30), 'stub.jpg'],
      ] as const) {
        const res = await send(owner, Buffer.from(data), name);
        expect([400, 415], `${name}: ${JSON.stringify(res.body)}`).toContain(res.status);
        expect(res.body.error.message).toMatch(/\w+ \w+/);
      }
    });
  });

  it('leaves no file when storing the second copy or writing the row fails', async () => {
    const storage = env.ctx.storage;
    const put = storage.put.bind(storage);
    let calls = 0;
    storage.put = async (...args) => {
      if (++calls === 2)
        throw Object.assign(new Error('no space left on device'), { code: 'ENOSPC' });
      return put(...args);
    };
    try {
      await expectNothingStored(async () => {
        const res = await send(owner, await png(120, 90, 21), 'disk-full.png');
        expect(res.status).toBe(503);
        expect(res.body.error.message).toMatch(/nothing was saved/);
      });
    } finally {
      storage.put = put;
    }

    const create = vi
      .spyOn(Upload, 'create')
      .mockRejectedValueOnce(
        Object.assign(new Error('SQLITE_BUSY: database is locked'), { code: 'SQLITE_BUSY' }),
      );
    try {
      await expectNothingStored(async () => {
        const res = await send(owner, await png(120, 90, 22), 'busy.png');
        expect(res.status).toBe(503);
      });
    } finally {
      create.mockRestore();
    }
  });

  it('keeps a ../../ file name harmless', async () => {
    const before = storedFiles();
    const res = await send(owner, await png(50, 50, 7), '../../evil.png');
    expect(res.status).toBe(201);
    expect(res.body.originalName).toBe('evil.png');
    const web = await owner.get(res.body.url);
    expect(web.headers['content-disposition']).toBe('inline; filename="evil.png"');
    const root = env.ctx.config.uploadDir;
    expect(fs.existsSync(path.resolve(root, '../../evil.png'))).toBe(false);
    expect(fs.existsSync(path.resolve(root, '..', 'evil.png'))).toBe(false);
    const added = storedFiles().filter((f) => !before.includes(f));
    expect(added).toHaveLength(2);
    for (const f of added)
      expect(f).toMatch(/^[a-f0-9]{2}\/[a-f0-9]{2}\/[a-f0-9]{64}-(web|thumb)\.png$/);
  });

  it('answers with a sentence for forms without the image in "file"', async () => {
    const noFile = await owner.agent
      .post('/api/uploads')
      .set('X-CSRF-Token', owner.csrf)
      .field('title', 'x');
    expect(noFile.status).toBe(400);
    expect(noFile.body.error.code).toBe('NO_FILE');
    const wrongField = await owner.agent
      .post('/api/uploads')
      .set('X-CSRF-Token', owner.csrf)
      .attach('photo', await png(10, 10), 'a.png');
    expect(wrongField.status).toBe(400);
    const two = await owner.agent
      .post('/api/uploads')
      .set('X-CSRF-Token', owner.csrf)
      .attach('file', await png(10, 10), 'a.png')
      .attach('file', await png(10, 10, 2), 'b.png');
    expect(two.status).toBe(400);
    const json = await owner.post('/api/uploads', { file: 'abc' });
    expect(json.status).toBe(415);
    const broken = await owner.agent
      .post('/api/uploads')
      .set('X-CSRF-Token', owner.csrf)
      .set('Content-Type', 'multipart/form-data; boundary=xyz')
      .send('--xyz\r\nContent-Disposition: form-data; name="file"; filename="a.png"\r\n\r\nabc');
    expect(broken.status).toBe(400);
    expect(broken.body.error.message).toMatch(/\w+ \w+/);
  });

  it('refuses signed-out and unverified uploaders and a missing CSRF token', async () => {
    const data = await png(10, 10);
    expect((await send(anonymous, data, 'a.png')).status).toBe(401);
    const unverified = (await clientAs(env, 'unverified')).client;
    expect((await send(unverified, data, 'a.png')).status).toBe(403);
    const noToken = await owner.agent.post('/api/uploads').attach('file', data, 'a.png');
    expect(noToken.status).toBe(403);
  });
});

describe('GET /api/uploads/:id', { timeout: 60_000 }, () => {
  let upload: { id: string; url: string; thumbUrl: string };

  beforeAll(async () => {
    upload = (await send(owner, await jpeg(300, 200, 9), 'private.jpg')).body;
  });

  it('lets the uploader and moderators see an unattached upload, and no one else', async () => {
    expect((await owner.get(upload.url)).status).toBe(200);
    expect((await moderator.get(upload.thumbUrl)).status).toBe(200);
    for (const c of [other, anonymous]) {
      for (const url of [upload.url, upload.thumbUrl]) {
        const res = await c.get(url);
        expect(res.status).toBe(404);
        expect(res.body.error.message).toMatch(/not shared with you/);
      }
    }
  });

  it('lets anyone see it once its document has a published revision', async () => {
    const row = (await Upload.findOne({ where: { publicId: upload.id } }))!;
    const doc = await Document.create({
      kind: 'writeup',
      slug: `upload-test-${Date.now()}`,
      ownerId,
      publishedRevisionId: null,
    });
    await row.update({ documentId: doc.id });
    expect((await anonymous.get(upload.url)).status).toBe(404);
    await doc.update({ publishedRevisionId: 999_999 });
    expect((await anonymous.get(upload.url)).status).toBe(200);
    expect((await other.get(upload.thumbUrl)).status).toBe(200);
    await row.update({ documentId: null });
  });

  it('answers 404 for ids that are not uploads', async () => {
    for (const id of [
      '1',
      'abc',
      '00000000-0000-4000-8000-000000000000',
      '..%2F..%2Fetc%2Fpasswd',
    ]) {
      const res = await owner.get(`/api/uploads/${id}`);
      expect(res.status).toBe(404);
      expect(res.body.error.message).toMatch(/\w+ \w+/);
    }
  });
});

describe('POST /api/uploads/:id/flatten', { timeout: 60_000 }, () => {
  let upload: { id: string; url: string; width: number; height: number };

  beforeAll(async () => {
    upload = (await send(owner, await jpeg(800, 600, 5), 'harness.jpg')).body;
  });

  it('downloads the web copy with the annotations drawn in', async () => {
    const annotations = [
      { id: 'm1', type: 'marker', x: 0.25, y: 0.25, color: 'copper', text: 'feed' },
      { id: 'a1', type: 'arrow', x: 0.1, y: 0.9, x2: 0.5, y2: 0.5, color: 'signal-yellow' },
      {
        id: 'b1',
        type: 'box',
        x: 0.6,
        y: 0.6,
        x2: 0.9,
        y2: 0.9,
        color: 'coolant-cyan',
        text: 'relay',
      },
      { id: 'l1', type: 'label', x: 0.05, y: 0.05, color: 'chalk-white', text: 'Wire side' },
    ];
    const res = await owner.post(`${upload.url}/flatten`, { annotations }).buffer(true);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.headers['content-type']).toBe('image/jpeg');
    expect(res.headers['content-disposition']).toBe('attachment; filename="harness-annotated.jpg"');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    const out = await Jimp.read(res.body as Buffer);
    expect([out.width, out.height]).toEqual([upload.width, upload.height]);
    const plain = await Jimp.read((await owner.get(upload.url).buffer(true)).body as Buffer);
    // Beside its number, the marker's disc is copper (#c8702a); the plain copy is not.
    const x = Math.round(0.25 * out.width) + 9;
    const y = Math.round(0.25 * out.height) + 6;
    const rgb = (c: number) => [(c >>> 24) & 255, (c >>> 16) & 255, (c >>> 8) & 255];
    const [r, g, b] = rgb(out.getPixelColor(x, y));
    expect(
      Math.abs(r - 0xc8) + Math.abs(g - 0x70) + Math.abs(b - 0x2a),
      `rgb ${r},${g},${b}`,
    ).toBeLessThan(60);
    expect(rgb(plain.getPixelColor(x, y))).not.toEqual([r, g, b]);
  });

  it('answers 400 naming the field for annotations that do not fit', async () => {
    const cases = [
      { annotations: [{ id: 'x', type: 'marker', x: 2, y: 0, color: 'copper' }] },
      { annotations: [{ id: 'x', type: 'marker', x: 0, y: 0, color: 'red' }] },
      { annotations: [{ id: 'x', type: 'circle', x: 0, y: 0, color: 'copper' }] },
      {
        annotations: Array.from({ length: 101 }, (_, i) => ({
          id: `m${i}`,
          type: 'marker',
          x: 0,
          y: 0,
          color: 'copper',
        })),
      },
      {
        annotations: [
          { id: 'x', type: 'label', x: 0, y: 0, color: 'copper', text: 'a'.repeat(201) },
        ],
      },
      { annotations: [], extra: 1 },
    ];
    for (const body of cases) {
      const res = await owner.post(`${upload.url}/flatten`, body);
      expect(res.status, JSON.stringify(body).slice(0, 80)).toBe(400);
      expect(res.body.error.message).toMatch(/\w+ \w+/);
    }
  });

  it('answers 404 to someone who may not see the image', async () => {
    const res = await other.post(`${upload.url}/flatten`, { annotations: [] });
    expect(res.status).toBe(404);
  });
});

describe('safeFileName', () => {
  it('keeps only a harmless base name', () => {
    expect(safeFileName('../../evil.png', 'image/png')).toBe('evil.png');
    expect(safeFileName('..\\..\\windows\\evil.jpg', 'image/jpeg')).toBe('evil.jpg');
    expect(safeFileName('Schaltplan Türmodul.jpeg', 'image/jpeg')).toBe('Schaltplan Turmodul.jpg');
    expect(safeFileName('a"b\r\nX-Evil: 1.png', 'image/png')).toBe('a_b_X-Evil_ 1.png');
    expect(safeFileName('....', 'image/png')).toBe('image.png');
    expect(safeFileName(undefined, 'image/png')).toBe('image.png');
  });
});

describe('ImagePool', { timeout: 60_000 }, () => {
  it('stops a task that runs past its time and says so', async () => {
    const { ImagePool, ImagePoolError } = await import('../../server/workers/imagePool');
    const pool = new ImagePool({ threads: 1, taskTimeoutMs: 1, taskTimeoutMsPerMegapixel: 0 });
    try {
      const data = await jpeg(1200, 900, 4);
      const err = await pool.process(data, 'image/jpeg', 1200 * 900).catch((e) => e);
      expect(err).toBeInstanceOf(ImagePoolError);
      expect(err.kind).toBe('timeout');
      expect(pool.stats().pixelsInFlight).toBe(0);
    } finally {
      await pool.close();
    }
  });
});
