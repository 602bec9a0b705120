import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { clientAs, createTestEnv, type Client, type TestEnv } from '../helpers/context';
import type { SearchAnswer } from '../../shared/schemas/search';
import { snippetParts } from '../../shared/search/snippet';

let env: TestEnv;
let author: Client;
let moderator: Client;
let reader: Client;

type Content = Record<string, unknown>;

const pin = (cavity: string, role: string, color: string, circuit = '', note = '') => ({
  cavity,
  role,
  color,
  size: '0.5 mm²',
  circuit,
  note,
});

async function draft(kind: string, title: string, content: Content) {
  const res = await author.post('/api/documents', { kind, title, content });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: number; slug: string; revision: { id: number; version: number } };
}

async function submit(id: number) {
  const res = await author.post(`/api/documents/${id}/submit`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.revision as { id: number };
}

async function publish(kind: string, title: string, content: Content) {
  const doc = await draft(kind, title, content);
  const rev = await submit(doc.id);
  const res = await moderator.post(`/api/review/${rev.id}/publish`, {});
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return doc;
}

async function search(query: string): Promise<SearchAnswer> {
  const res = await reader.get(`/api/search${query ? `?${query}` : ''}`);
  expect(res.status, `${query}: ${JSON.stringify(res.body)}`).toBe(200);
  return res.body as SearchAnswer;
}

const titles = (a: SearchAnswer) => a.items.map((i) => i.title);

const connector = (over: Content): Content => ({
  labels: 'numeric',
  housing: 'socket',
  view: 'wire-side',
  sealed: false,
  tags: [],
  pins: [],
  ...over,
});

const docs: Record<string, { id: number; slug: string }> = {};
let publishedCount = 0;

beforeAll(async () => {
  env = await createTestEnv();
  author = (await clientAs(env, 'member')).client;
  moderator = (await clientAs(env, 'moderator')).client;
  reader = (await clientAs(env, 'anonymous')).client;

  docs.coolant = await publish(
    'connector',
    'Orrin coolant temperature sensor, 3-cavity',
    connector({
      cavities: ['A', 'B', 'C'],
      labels: 'alpha',
      layout: { rows: 1, cols: 3 },
      sealed: true,
      component: 'coolant temperature sensor',
      tags: ['Brindlemoor 4.2 platform', 'thermostat housing'],
      pins: [
        pin('A', 'signal', 'GN/YE', 'T31', 'to the control module'),
        pin('B', 'low reference', 'BN', 'T32'),
        pin('C', 'signal', 'BU', 'T35', 'gauge sender'),
      ],
    }),
  );
  docs.pump = await publish(
    'connector',
    'Orrin fuel pump module plug, 10-cavity',
    connector({
      cavityCount: 10,
      layout: { rows: 2, cols: 5 },
      component: 'fuel pump module',
      tags: ['Quorvane T3 engine'],
      pins: [pin('1', 'battery feed', 'RD', 'F1'), pin('2', 'ground', 'BK', 'G1')],
    }),
  );
  docs.pedal = await publish(
    'connector',
    'Orrin pedal position sensor, 6-way',
    connector({
      cavityCount: 6,
      layout: { rows: 2, cols: 3 },
      housing: 'pin',
      component: 'accelerator pedal position sensor',
      tags: ['Brindlemoor 4.2 platform'],
      pins: [pin('1', '5 V reference', 'GY', 'P11'), pin('2', 'signal', 'VT', 'P12')],
    }),
  );
  docs.hostile = await publish(
    'connector',
    '<img src=x onerror=alert(1)> probe plug',
    connector({
      cavityCount: 2,
      component: 'probe <b>bold</b>',
      summary: 'Harmless? <img src=x onerror=alert(1)> and <script>alert(2)</script> inside',
      pins: [pin('1', 'signal <i>x</i>', 'WH', '', '<script>alert(3)</script>')],
    }),
  );
  docs.adapter = await publish('adapter', 'Orrin coolant sensor extension, 3-way', {
    systemVoltage: 12,
    ends: {
      A: { label: 'harness plug', cavities: ['A', 'B', 'C'], view: 'wire-side' },
      B: { label: 'sensor plug', cavities: ['A', 'B', 'C'], view: 'wire-side' },
    },
    circuits: [
      { id: 'w1', a: ['A'], b: ['A'], role: 'signal', size: '0.5 mm²', color: 'GN/YE' },
      { id: 'w2', a: ['B'], b: ['B'], role: 'low reference', size: '0.5 mm²', color: 'BN' },
      { id: 'w3', a: ['C'], b: ['C'], role: 'signal', size: '0.5 mm²', color: 'BU' },
    ],
  });
  docs.writeup = await publish('writeup', 'Relocating a coolant sensor to the radiator hose', {
    body: '# Moving the sensor\n\nCut the **harness** and extend it with a [sealed splice](http://example.test).',
  });
  publishedCount = 6;

  // Never published: a draft and a submission waiting for review.
  await draft('connector', 'Orrin secret coolant draft', connector({ cavityCount: 3 }));
  const waiting = await draft(
    'connector',
    'Orrin waiting coolant submission',
    connector({ cavityCount: 3 }),
  );
  await submit(waiting.id);
});

afterAll(() => env.close());

describe('GET /api/search', () => {
  it('answers the stable row shape over published documents only', async () => {
    const all = await search('');
    expect(all.total).toBe(publishedCount);
    const a = await search('q=coolant');
    expect(a.total).toBe(3);
    expect(titles(a)).toEqual(
      expect.arrayContaining([
        'Orrin coolant temperature sensor, 3-cavity',
        'Orrin coolant sensor extension, 3-way',
        'Relocating a coolant sensor to the radiator hose',
      ]),
    );
    expect(titles(a).join()).not.toMatch(/secret|waiting/);
    for (const item of a.items) {
      expect(Object.keys(item)).toEqual(
        expect.arrayContaining(['id', 'slug', 'kind', 'title', 'snippet']),
      );
      expect(typeof item.snippet).toBe('string');
    }
  });

  it('ranks a title match first and marks the matched words', async () => {
    const a = await search('q=temperature');
    expect(a.items[0].slug).toBe(docs.coolant.slug);
    expect(a.items[0].titleRanges.length).toBeGreaterThan(0);
    const b = await search('q=gauge');
    expect(b.items[0].snippet).toContain('<mark>gauge</mark>');
    const marked = snippetParts(b.items[0].snippet).filter((p) => p.mark);
    expect(marked.map((p) => p.text.toLowerCase())).toContain('gauge');
  });

  it('carries what a result card shows, with a compact pin map', async () => {
    const a = await search('q=thermostat');
    const item = a.items[0];
    expect(item).toMatchObject({
      cavityCount: 3,
      component: 'coolant temperature sensor',
      tags: ['Brindlemoor 4.2 platform', 'thermostat housing'],
      sealed: true,
      housing: 'socket',
    });
    expect(Date.parse(item.reviewedAt)).toBeGreaterThan(Date.now() - 60_000);
    expect(item.pinMap).toEqual({
      rows: 1,
      cols: 3,
      view: 'wire-side',
      housing: 'socket',
      cells: [
        ['A', 0, 0, 'GN/YE'],
        ['B', 0, 1, 'BN'],
        ['C', 0, 2, 'BU'],
      ],
    });
  });

  it('matches prefixes and substrings', async () => {
    expect((await search('q=coola')).total).toBe(3);
    expect((await search('q=thermo')).items[0].slug).toBe(docs.coolant.slug);
  });

  it('searches a quoted phrase as a phrase', async () => {
    const a = await search(`q=${encodeURIComponent('"temperature sensor"')}`);
    expect(titles(a)).toEqual(['Orrin coolant temperature sensor, 3-cavity']);
    const b = await search(`q=${encodeURIComponent('"sensor temperature"')}`);
    expect(b.total).toBe(0);
  });

  it('finds short words and codes: "5 V reference", "3-cavity", "GN/YE", "GY"', async () => {
    expect(titles(await search(`q=${encodeURIComponent('5 V reference')}`))).toEqual([
      'Orrin pedal position sensor, 6-way',
    ]);
    expect((await search('q=3-cavity')).items[0].slug).toBe(docs.coolant.slug);
    expect((await search(`q=${encodeURIComponent('3 cavity')}`)).items[0].slug).toBe(
      docs.coolant.slug,
    );
    const gnye = await search(`q=${encodeURIComponent('GN/YE')}`);
    expect(gnye.items.map((i) => i.slug).sort()).toEqual(
      [docs.coolant.slug, docs.adapter.slug].sort(),
    );
    expect(titles(await search('q=GY'))).toEqual(['Orrin pedal position sensor, 6-way']);
  });

  it('tolerates a small typo and says what it searched instead', async () => {
    const a = await search('q=coolnat');
    expect(a.total).toBe(3);
    expect(a.corrected).toEqual({ q: 'coolant', words: [{ from: 'coolnat', to: 'coolant' }] });
    const b = await search(`q=${encodeURIComponent('temprature sensr')}`);
    expect(b.items[0]?.slug).toBe(docs.coolant.slug);
    expect(b.corrected?.words.map((w) => w.to)).toEqual(['temperature', 'sensor']);
    const c = await search('q=peddal');
    expect(titles(c)).toEqual(['Orrin pedal position sensor, 6-way']);
    // A word that is nowhere near anything stays unmatched.
    const none = await search('q=xylophone');
    expect(none).toMatchObject({ total: 0, items: [], corrected: null });
  });

  it('filters by kind, cavity count (exact and range), component, sealed and housing', async () => {
    expect((await search('kind=adapter')).items.map((i) => i.slug)).toEqual([docs.adapter.slug]);
    expect((await search('q=coolant&kind=connector')).total).toBe(1);
    expect((await search('cavities=10')).items.map((i) => i.slug)).toEqual([docs.pump.slug]);
    // An adapter matches the cavity count of either end.
    expect((await search('cavities=3')).items.map((i) => i.slug).sort()).toEqual(
      [docs.coolant.slug, docs.adapter.slug].sort(),
    );
    const range = await search('kind=connector&cavitiesMin=3&cavitiesMax=6');
    expect(range.items.map((i) => i.slug).sort()).toEqual(
      [docs.coolant.slug, docs.pedal.slug].sort(),
    );
    expect((await search('cavitiesMin=7')).items.map((i) => i.slug)).toEqual([docs.pump.slug]);
    expect((await search(`component=${encodeURIComponent('Fuel Pump Module')}`)).total).toBe(1);
    expect((await search('sealed=true')).items.map((i) => i.slug)).toEqual([docs.coolant.slug]);
    expect((await search('sealed=false&kind=connector')).total).toBe(3);
    expect((await search('housing=pin')).items.map((i) => i.slug)).toEqual([docs.pedal.slug]);
  });

  it('filters by wire colour present, role present and applicability tag', async () => {
    // GN matches a GN/YE wire; GN/YE matches it exactly; names work too.
    expect((await search('color=GN&kind=connector')).items.map((i) => i.slug)).toEqual([
      docs.coolant.slug,
    ]);
    expect((await search(`color=${encodeURIComponent('GN/YE')}`)).total).toBe(2);
    expect((await search('color=violet')).items.map((i) => i.slug)).toEqual([docs.pedal.slug]);
    expect((await search(`role=${encodeURIComponent('5 V reference')}`)).total).toBe(1);
    expect((await search(`role=${encodeURIComponent('battery feed')}`)).items[0].slug).toBe(
      docs.pump.slug,
    );
    expect(
      (await search(`tag=${encodeURIComponent('brindlemoor 4.2 PLATFORM')}`)).items
        .map((i) => i.slug)
        .sort(),
    ).toEqual([docs.coolant.slug, docs.pedal.slug].sort());
    expect((await search('tag=nowhere')).total).toBe(0);
  });

  it('sorts by newest and by cavity count', async () => {
    const newest = await search('sort=newest');
    expect(newest.items[0].slug).toBe(docs.writeup.slug);
    const byCavities = await search('kind=connector&sort=cavities');
    expect(byCavities.items.map((i) => i.cavityCount)).toEqual([2, 3, 6, 10]);
    const relevance = await search('q=sensor&sort=newest');
    expect(relevance.sort).toBe('newest');
  });

  it('pages with a total that does not change from page to page', async () => {
    const first = await search('limit=2&sort=newest');
    const second = await search('limit=2&offset=2&sort=newest');
    const last = await search('limit=2&offset=4&sort=newest');
    const beyond = await search('limit=2&offset=40&sort=newest');
    for (const page of [first, second, last, beyond]) expect(page.total).toBe(publishedCount);
    const ids = [...first.items, ...second.items, ...last.items].map((i) => i.id);
    expect(new Set(ids).size).toBe(publishedCount);
    expect(beyond.items).toEqual([]);
    const q = await search('q=coolant&limit=1&offset=1');
    expect(q).toMatchObject({ total: 3, limit: 1, offset: 1 });
    expect(q.items).toHaveLength(1);
  });

  it.each([
    ['limit=0', 'limit'],
    ['limit=101', 'limit'],
    ['limit=ten', 'limit'],
    ['offset=-1', 'offset'],
    ['offset=1.5', 'offset'],
    ['kind=sheet', 'kind'],
    ['cavities=0', 'cavities'],
    ['cavities=many', 'cavities'],
    ['cavitiesMin=6&cavitiesMax=3', 'cavitiesMax'],
    ['sealed=maybe', 'sealed'],
    ['housing=plug', 'housing'],
    ['color=plaid', 'color'],
    ['sort=random', 'sort'],
    ['page=2', 'page'],
    ['kind=adapter&kind=connector', 'kind'],
    [`q=${'x'.repeat(201)}`, 'q'],
  ])('answers 400 naming the parameter for %s', async (query, name) => {
    const res = await reader.get(`/api/search?${query}`);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('VALIDATION');
    expect(res.body.error.message).toContain(`"${name}"`);
    expect(res.body.error.message).toMatch(/^The parameter .+\.$/);
  });

  it('never errors on FTS syntax, quotes or odd characters: they are searched as text', async () => {
    const nasty = [
      '"',
      '""',
      '"""',
      "'",
      'NEAR(coolant sensor, 2)',
      'coolant*',
      '*',
      '^coolant',
      'title:coolant',
      '{title component}:coolant',
      '- coolant',
      'coolant OR pump AND NOT sensor',
      '(((',
      ')))',
      'a:b:c',
      '\\',
      '%',
      '_',
      '"coolant',
      'coolant"',
      '"coo"lant"',
      'coolant + -',
      '💡 coolant',
      '"*^():{}[]'.repeat(20),
    ];
    for (const q of nasty) {
      const res = await reader.get(`/api/search?q=${encodeURIComponent(q)}`);
      expect(res.status, q).toBe(200);
      expect(Array.isArray(res.body.items), q).toBe(true);
      const s = await reader.get(`/api/search/suggest?q=${encodeURIComponent(q)}`);
      expect(s.status, q).toBe(200);
    }
    // A NUL is the one character no field accepts anywhere: a sentence, not a search.
    const nul = await reader.get(`/api/search?q=${encodeURIComponent('\u0000coolant')}`);
    expect(nul.status).toBe(400);
    expect(nul.body.error.code).toBe('NUL_CHARACTER');
    // Operators are not operators: NOT does not exclude.
    const or = await search(`q=${encodeURIComponent('coolant OR pump')}`);
    expect(or.total).toBe(0);
    const star = await search(`q=${encodeURIComponent('coolant*')}`);
    expect(star.total).toBe(0);
    expect((await search(`q=${encodeURIComponent('title:coolant')}`)).total).toBe(0);
  });

  it('escapes HTML from documents in snippets; only its own <mark> tags are markup', async () => {
    const a = await search('q=onerror');
    const item = a.items.find((i) => i.slug === docs.hostile.slug)!;
    expect(item.title).toBe('<img src=x onerror=alert(1)> probe plug');
    expect(item.snippet).toContain('&lt;img src=x <mark>onerror</mark>=alert(1)&gt;');
    expect(item.snippet).toContain('&lt;script&gt;');
    const tags = item.snippet.match(/<\/?[a-z]+[^>]*>/gi) ?? [];
    expect(tags.every((t) => t === '<mark>' || t === '</mark>')).toBe(true);
    // Read back as parts, it is the document's text exactly, markup and all, as text.
    expect(
      snippetParts(item.snippet)
        .map((p) => p.text)
        .join(''),
    ).toContain('<img src=x onerror=alert(1)> and <script>alert(2)</script>');
    const script = await search('q=alert');
    for (const i of script.items) {
      expect(i.snippet).not.toMatch(/<(script|img|b|i)\b/i);
    }
  });

  it('leaves the index when a revision is superseded', async () => {
    const doc = await publish(
      'connector',
      'Orrin wiper motor plug, 4-cavity',
      connector({ cavityCount: 4, component: 'wiper motor' }),
    );
    publishedCount++;
    expect((await search('q=wiper')).total).toBe(1);
    const editor = await author.get(`/api/documents/${doc.id}/editor`);
    const saved = await author.put(`/api/documents/${doc.id}/draft`, {
      title: 'Orrin washer pump plug, 2-cavity',
      content: connector({ cavityCount: 2, component: 'washer pump' }),
      version: editor.body.revision.version,
    });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    // While the next revision waits in review, the published one stays findable.
    const rev = await submit(doc.id);
    expect((await search('q=wiper')).total).toBe(1);
    expect((await search('q=washer')).total).toBe(0);
    expect((await moderator.post(`/api/review/${rev.id}/publish`, {})).status).toBe(200);
    expect((await search('q=wiper')).total).toBe(0);
    const washer = await search('q=washer');
    expect(washer.items.map((i) => i.id)).toEqual([doc.id]);
    expect(washer.items[0].cavityCount).toBe(2);
    const rows = await env.ctx.sequelize.query(
      'SELECT revision_id FROM search_texts WHERE document_id = ?',
      { replacements: [doc.id], type: QueryTypes.SELECT },
    );
    expect(rows).toEqual([{ revision_id: rev.id }]);
    // The vocabulary forgets words nothing published uses any more.
    const words = await env.ctx.sequelize.query('SELECT word FROM search_words WHERE word = ?', {
      replacements: ['wiper'],
      type: QueryTypes.SELECT,
    });
    expect(words).toEqual([]);
  });

  it('indexes in the same transaction that publishes', async () => {
    const doc = await draft('connector', 'Orrin horn relay socket', connector({ cavityCount: 4 }));
    const rev = await submit(doc.id);
    const seen: Array<{ sql: string; tx: string | undefined }> = [];
    const options = (env.ctx.sequelize as unknown as { options: { logging?: unknown } }).options;
    const before = options.logging;
    options.logging = (sql: string, opts: { transaction?: { id: string } }) =>
      seen.push({ sql, tx: opts?.transaction?.id });
    try {
      expect((await moderator.post(`/api/review/${rev.id}/publish`, {})).status).toBe(200);
    } finally {
      options.logging = before;
    }
    publishedCount++;
    const publishing = seen.find(
      (s) => /UPDATE `revisions` SET `status`=/.test(s.sql) && /published/.test(s.sql),
    );
    const indexing = seen.find((s) => /INSERT INTO search_docs/.test(s.sql));
    expect(publishing?.tx).toBeTruthy();
    expect(indexing?.tx).toBe(publishing?.tx);
    expect((await search('q=horn relay')).total).toBe(1);
  });

  it('rolls publishing back when indexing fails', async () => {
    const doc = await draft('connector', 'Orrin doomed index probe', connector({ cavityCount: 1 }));
    const rev = await submit(doc.id);
    await env.ctx.sequelize.query(
      `CREATE TRIGGER fail_search AFTER INSERT ON search_docs WHEN NEW.title LIKE '%doomed%'
       BEGIN SELECT RAISE(ABORT, 'index refused'); END`,
    );
    try {
      const res = await moderator.post(`/api/review/${rev.id}/publish`, {});
      expect(res.status).not.toBe(200);
    } finally {
      await env.ctx.sequelize.query('DROP TRIGGER fail_search');
    }
    const view = await reader.get(`/api/documents/${doc.slug}`);
    expect(view.status).toBe(404);
    const queue = await moderator.get('/api/review/queue');
    expect(queue.body.map((q: { revisionId: number }) => q.revisionId)).toContain(rev.id);
    expect((await search('q=doomed')).total).toBe(0);
  });
});

describe('GET /api/search/suggest', () => {
  it('suggests published titles, components and tags for what has been typed', async () => {
    const res = await reader.get('/api/search/suggest?q=cool');
    expect(res.status).toBe(200);
    const items = res.body.items as Array<{ type: string; text: string; slug?: string }>;
    expect(items.filter((i) => i.type === 'document').map((i) => i.slug)).toContain(
      docs.coolant.slug,
    );
    expect(items).toContainEqual({
      type: 'component',
      text: 'coolant temperature sensor',
      count: 1,
    });
    const tags = await reader.get('/api/search/suggest?q=brin');
    expect(tags.body.items).toContainEqual({
      type: 'tag',
      text: 'Brindlemoor 4.2 platform',
      count: 2,
    });
    expect((await reader.get('/api/search/suggest?q=')).body).toEqual({ items: [] });
    expect((await reader.get('/api/search/suggest?q=secret')).body.items).toEqual([]);
    expect((await reader.get('/api/search/suggest?q=pu')).status).toBe(200);
  });

  it('answers 400 for an unknown parameter', async () => {
    const res = await reader.get('/api/search/suggest?q=x&limit=3');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain('"limit"');
  });
});

describe('GET /api/browse', () => {
  it('counts components and cavity counts of published documents', async () => {
    const res = await reader.get('/api/browse');
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(publishedCount);
    expect(res.body.components).toContainEqual({ name: 'fuel pump module', count: 1 });
    expect(res.body.cavities).toContainEqual({ cavities: 3, count: 1 });
    expect(res.body.kinds).toContainEqual({ kind: 'adapter', count: 1 });
    expect(res.body.tags).toContainEqual({ name: 'Brindlemoor 4.2 platform', count: 2 });
  });
});
