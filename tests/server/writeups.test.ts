import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';
import { png } from '../helpers/images';
import { XSS_PAYLOADS, executableParts } from '../helpers/xssPayloads';
import { emptyWire } from '../../shared/schemas/writeup';
import { bodyPlainText, writeupMarkdown } from '../../shared/writeup/markdown';
import { serverMarkdown } from '../../server/markdown';
import { writeupSearchText, writeupSummary } from '../../server/services/writeups';

/** The write-up syntax sanitised by the server's DOMPurify, as the client renders it. */
const writeupHtml = serverMarkdown({ plugins: [writeupMarkdown] });

let env: TestEnv;
let author: Client;
let other: Client;
let moderator: Client;
let anonymous: Client;

beforeAll(async () => {
  env = await createTestEnv();
  author = (await clientAs(env, 'member')).client;
  other = (await clientAs(env, 'member')).client;
  moderator = (await clientAs(env, 'moderator')).client;
  anonymous = (await clientAs(env, 'anonymous')).client;
});
afterAll(() => env.close());

async function upload(client: Client, seed: number) {
  const res = await client.agent
    .post('/api/uploads')
    .set('X-CSRF-Token', client.csrf)
    .attach('file', await png(480, 320, seed), `photo-${seed}.png`);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; url: string; thumbUrl: string; width: number; height: number };
}

const marker = (id: string, x: number, y: number) => ({
  id,
  type: 'marker',
  x,
  y,
  color: 'signal-yellow',
});

async function createWriteup(title: string, content: Record<string, unknown>) {
  const res = await author.post('/api/documents', { kind: 'writeup', title, content });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: number; slug: string; revision: { version: number } };
}

async function submitAndClaim(id: number) {
  const sub = await author.post(`/api/documents/${id}/submit`);
  expect(sub.status, JSON.stringify(sub.body)).toBe(200);
  const queue = await moderator.get('/api/review/queue?kind=writeup');
  const item = queue.body.find((q: { documentId: number }) => q.documentId === id);
  expect(item).toBeTruthy();
  return item.revisionId as number;
}

describe('write-up documents', { timeout: 120_000 }, () => {
  let photo1: Awaited<ReturnType<typeof upload>>;
  let photo2: Awaited<ReturnType<typeof upload>>;

  beforeAll(async () => {
    photo1 = await upload(author, 1);
    photo2 = await upload(author, 2);
  });

  it('stores images with markings, a wire run, a parts list and values, in SI', async () => {
    const content = {
      body: 'Moved the plug.\n\n![The plug](image:1)\n\n![The loom](image:2)',
      images: [
        {
          uploadId: photo1.id,
          caption: 'The plug',
          annotations: [marker('m1', 0.2, 0.3), marker('m2', 0.4, 0.3)],
          width: photo1.width,
          height: photo1.height,
        },
        {
          uploadId: photo2.id,
          caption: 'The loom',
          annotations: [
            { id: 'a1', type: 'arrow', x: 0.1, y: 0.9, x2: 0.5, y2: 0.5, color: 'copper' },
          ],
        },
      ],
      wireRun: {
        wires: [
          {
            ...emptyWire(),
            color: 'GN/YE',
            size: '0.5 mm²',
            from: 'a',
            to: 'b',
            addedLengthMm: 350,
          },
        ],
      },
      parts: {
        options: [{ id: 'a', name: 'A' }],
        items: [{ name: 'Splices', quantity: 6, priceLow: 0.2, priceHigh: 0.4, options: ['a'] }],
      },
      specs: [{ label: 'Bracket bolt', quantity: 'torque', value: 10.1 }],
    };
    const doc = await createWriteup('Moving a plug', content);
    const editor = await author.get(`/api/documents/${doc.id}/editor`);
    expect(editor.body.revision.content.images[0].annotations).toHaveLength(2);
    expect(editor.body.revision.content.wireRun.wires[0]).toMatchObject({
      addedLengthMm: 350,
      join: 'crimped-splice',
    });
    expect(editor.body.revision.content.specs[0].value).toBe(10.1);
  });

  it('keeps write-ups of body only, as before', async () => {
    const doc = await createWriteup('Only text', { body: '# Steps' });
    const editor = await author.get(`/api/documents/${doc.id}/editor`);
    expect(editor.body.revision.content).toMatchObject({ body: '# Steps', images: [] });
  });

  it.each([
    [{ body: 'x', images: [{ uploadId: '../../etc/passwd', caption: '' }] }, 'images'],
    [
      {
        body: 'x',
        images: [
          {
            uploadId: '00000000-0000-4000-8000-000000000000',
            annotations: [{ id: 'a', type: 'marker', x: 2, y: 0, color: 'copper' }],
          },
        ],
      },
      'images',
    ],
    [{ body: 'x', wireRun: { wires: [{ ...emptyWire(), join: 'twisted' }] } }, 'wireRun'],
    [{ body: 'x', wireRun: { wires: [{ ...emptyWire(), addedLengthMm: -5 }] } }, 'wireRun'],
    [
      {
        body: 'x',
        parts: {
          options: [
            { id: 'a', name: 'A' },
            { id: 'a', name: 'B' },
          ],
          items: [],
        },
      },
      'parts',
    ],
    [{ body: 'x', specs: [{ label: 'x', quantity: 'voltage', value: 1 }] }, 'specs'],
    [{ body: 'x', colour: 'red' }, 'colour'],
    [{ body: 'x'.repeat(100_001) }, 'body'],
  ])('answers 400 naming the field for %#', async (content, field) => {
    const res = await author.post('/api/documents', { kind: 'writeup', title: 'Bad', content });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error)).toContain(field);
  });

  it('tells the author and the moderator when a caution block is missing', async () => {
    const doc = await createWriteup('Pump relay move', {
      body: 'Move the fuel pump relay and run a new battery feed to it.\n\n:::caution battery\nDisconnect the battery first.\n:::\n',
    });
    const own = await author.get(`/api/documents/${doc.id}?revision=1`);
    expect(own.status).toBe(200);
    const codes = own.body.findings.warnings.map(
      (w: { code: string; kind?: string }) => `${w.code}:${w.kind}`,
    );
    expect(codes).toEqual(['CAUTION_MISSING:fuel']);
    expect(own.body.findings.cautions).toEqual(['fuel', 'battery']);

    const revisionId = await submitAndClaim(doc.id);
    const review = await moderator.get(`/api/review/${revisionId}`);
    expect(review.status).toBe(200);
    expect(review.body.findings.warnings[0].message).toContain('":::caution fuel"');
    const line = review.body.checklist.find((c: { key: string }) => c.key === 'cautions');
    expect(line).toMatchObject({ auto: true, ok: false });
  });

  it('reports images that are not stored and sheet links to nothing published', async () => {
    const doc = await createWriteup('Broken references', {
      body: '![x](image:1)\n\n![y](image:3)\n\n[[sheet:no-such-sheet]]',
      images: [
        { uploadId: '00000000-0000-4000-8000-000000000000', caption: 'gone', annotations: [] },
      ],
    });
    const own = await author.get(`/api/documents/${doc.id}?revision=1`);
    expect(own.body.findings.errors.map((e: { code: string }) => e.code).sort()).toEqual([
      'IMAGE_MISSING',
      'IMAGE_REF_UNKNOWN',
    ]);
    expect(own.body.findings.warnings.map((e: { code: string }) => e.code)).toEqual([
      'SHEET_LINK_UNKNOWN',
    ]);
    expect(own.body.findings.ok).toBe(false);
  });

  it('shows images to everyone once published, and only the uploader’s own images', async () => {
    const foreign = await upload(other, 3);
    const doc = await createWriteup('Published photos', {
      body: '![a](image:1)\n\n![b](image:2)',
      images: [
        { uploadId: photo1.id, caption: 'mine', annotations: [marker('m1', 0.5, 0.5)] },
        { uploadId: foreign.id, caption: 'someone else’s', annotations: [] },
      ],
    });
    expect((await anonymous.get(photo1.url)).status).toBe(404);
    const revisionId = await submitAndClaim(doc.id);
    // A moderator sees every image under review.
    expect((await moderator.get(photo1.url)).status).toBe(200);
    expect((await moderator.get(foreign.url)).status).toBe(200);
    const pub = await moderator.post(`/api/review/${revisionId}/publish`, {});
    expect(pub.status).toBe(200);

    expect((await anonymous.get(photo1.url)).status).toBe(200);
    expect((await anonymous.get(photo1.thumbUrl)).status).toBe(200);
    expect((await anonymous.get(foreign.url)).status).toBe(404);
    const flat = await anonymous.post(`${photo1.url}/flatten`, {
      annotations: [marker('m1', 0.5, 0.5)],
    });
    expect(flat.status).toBe(200);
    expect(flat.headers['content-type']).toMatch(/^image\//);

    // The next published revision drops the image: it is private again.
    const editor = await author.get(`/api/documents/${doc.id}/editor`);
    const save = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Published photos',
      content: { body: 'No photos now.', images: [] },
      version: editor.body.revision.version,
    });
    expect(save.status, JSON.stringify(save.body)).toBe(200);
    const second = await submitAndClaim(doc.id);
    expect((await moderator.post(`/api/review/${second}/publish`, {})).status).toBe(200);
    expect((await anonymous.get(photo1.url)).status).toBe(404);
  });

  it('lists published write-ups only, newest first, with a thumbnail', async () => {
    const list = await anonymous.get('/api/writeups');
    expect(list.status).toBe(200);
    const titles = list.body.items.map((i: { title: string }) => i.title);
    expect(titles).toContain('Published photos');
    expect(titles).not.toContain('Only text');
    for (const q of ['limit=abc', 'limit=1000', 'offset=-1', 'limit=1.5']) {
      const bad = await anonymous.get(`/api/writeups?${q}`);
      expect(bad.status, q).toBe(400);
    }
    expect(
      (await anonymous.get('/api/writeups?limit=1&offset=0')).body.items.length,
    ).toBeLessThanOrEqual(1);
  });
});

describe('POST /api/review/:revisionId/return with image notes', { timeout: 60_000 }, () => {
  it('adds the image notes to the note; either a note or image notes is required', async () => {
    const doc = await createWriteup('Plate visible', { body: 'Text.' });
    const revisionId = await submitAndClaim(doc.id);
    const empty = await moderator.post(`/api/review/${revisionId}/return`, { note: '' });
    expect(empty.status).toBe(400);
    const bad = await moderator.post(`/api/review/${revisionId}/return`, {
      imageNotes: [{ image: 0, note: 'x' }],
    });
    expect(bad.status).toBe(400);
    const res = await moderator.post(`/api/review/${revisionId}/return`, {
      imageNotes: [{ image: 2, note: 'A number plate is readable.' }],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.revision.note).toBe(
      'Images sent back:\n- Image 2: A number plate is readable.',
    );
    const mine = await author.get('/api/me/documents');
    const row = mine.body.find((d: { id: number }) => d.id === doc.id);
    expect(row.latest).toMatchObject({ status: 'returned' });
    expect(row.latest.note).toContain('Image 2: A number plate');
  });
});

describe('write-up Markdown on the server', () => {
  it.each(XSS_PAYLOADS)('renders nothing executable from %s', (payload) => {
    const html = writeupHtml.render(payload);
    expect(executableParts(html)).toEqual([]);
    // Whatever survives as text is escaped: no raw tag can open.
    expect(html).not.toMatch(/<(script|svg|math|iframe|object|style|form)/i);
  });

  it('summarises a long body from its opening words', () => {
    const body = `Moved the **level sensor** forward.\n\n${'Then [a](/x) and *b*. '.repeat(20_000)}`;
    const summary = writeupSummary('Title', { body: body.slice(0, 100_000) });
    expect(summary.startsWith('Moved the level sensor forward. Then a and b.')).toBe(true);
    expect(summary.length).toBeLessThanOrEqual(160);
  });

  it('gives plain text for search and summaries, without markup', () => {
    expect(
      bodyPlainText('# Steps\n\n:::caution fuel\nRelieve it.\n:::\n\nCut **one** wire. <b>x</b>'),
    ).toBe('Steps Caution (fuel) Relieve it. Cut one wire. <b>x</b>');
    expect(
      bodyPlainText(
        ':::caution battery Disconnect first\nOff.\n:::\n\n![The bracket](image:1)\n\nSee [[sheet:pump-plug|the pump plug]], ![](image:2) and `GN/YE`.\n\n```\n12.4 V\n```',
      ),
    ).toBe(
      'Caution: Disconnect first Off. The bracket See the pump plug, image 2 and GN/YE. 12.4 V',
    );
    expect(
      writeupSearchText({
        body: 'Text',
        images: [
          {
            uploadId: '00000000-0000-4000-8000-000000000000',
            caption: 'The bracket',
            annotations: [{ id: 'a', type: 'label', x: 0, y: 0, text: 'Latch', color: 'copper' }],
          },
        ],
      }),
    ).toBe('Text The bracket Latch');
  });

  it('never answers 500 to odd draft content', async () => {
    const doc = await createWriteup('Odd', { body: '' });
    for (const content of [
      null,
      [],
      'text',
      { body: 5 },
      { images: 'x' },
      { wireRun: { wires: [null] } },
      { parts: { items: [{ quantity: 'many' }] } },
    ]) {
      const res = await author.put(`/api/documents/${doc.id}/draft`, {
        title: 'Odd',
        content,
        version: 1,
      });
      expect(res.status, JSON.stringify(content)).toBe(400);
    }
    const view = await author.get(`/api/documents/${doc.id}?revision=1`);
    expect(view.status).toBe(200);
    expect(view.body.findings.errors.map((e: { code: string }) => e.code)).toEqual(['BODY_EMPTY']);
  });
});
