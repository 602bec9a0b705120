import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import {
  Client as LoggedClient,
  clientAs,
  createTestEnv,
  type Client,
  type TestEnv,
} from '../helpers/context';
import { DEMO_CONNECTOR_SLUGS } from '../../server/seed/connectors';
import { resolveAdapterLinks } from '../../server/services/adapters';
import type { AdapterInput, CheckReport, Finding } from '../../shared/schemas/adapter';

let env: TestEnv;
let author: Client;
let moderator: Client;
let anon: Client;

beforeAll(async () => {
  env = await createTestEnv({ seedDemo: true });
  author = (await clientAs(env, 'member')).client;
  moderator = (await clientAs(env, 'moderator')).client;
  anon = (await clientAs(env, 'anonymous')).client;
});
afterAll(() => env.close());

const MAP = DEMO_CONNECTOR_SLUGS.mapSensor;
const CAM = DEMO_CONNECTOR_SLUGS.camSensor;
const PUMP = DEMO_CONNECTOR_SLUGS.pumpModule;
const HARNESS6 = DEMO_CONNECTOR_SLUGS.bodyHarness6;

const codes = (list: Finding[]) => list.map((f) => f.code);

async function docId(slug: string): Promise<number> {
  const doc = await env.ctx.models.Document.findOne({ where: { slug } });
  return doc!.id;
}

/** A MAP sensor extension between two links to the published MAP sensor sheet. */
function mapExtension(over: Partial<AdapterInput> = {}): AdapterInput {
  return {
    ends: { A: { connectorId: MAP }, B: { connectorId: MAP } },
    circuits: [
      { a: ['1'], b: ['1'], role: '5 V reference', size: '0.5 mm²', color: 'GY', lengthMm: 300 },
      { a: ['2'], b: ['2'], role: 'low reference', size: '0.5 mm²', color: 'BN/WH', lengthMm: 300 },
      { a: ['3'], b: ['3'], role: 'signal', size: '0.5 mm²', color: 'GN/VT', lengthMm: 300 },
    ],
    ...over,
  };
}

describe('POST /api/adapters/check with linked ends', () => {
  it('fills a linked end with the published sheet: cavities, roles, sealed, wire-size range', async () => {
    const res = await anon.post('/api/adapters/check', {
      ends: { A: { connectorId: PUMP }, B: { connectorId: HARNESS6 } },
      circuits: [
        { a: ['1'], b: ['1'], role: 'motor +', size: '14 AWG' },
        { a: ['3'], b: ['3'], role: 'ground', size: '26 AWG' },
      ],
    });
    expect(res.status).toBe(200);
    const report = res.body as CheckReport;
    // The pump module sheet has 10 cavities and is sealed; the 6-way harness is not.
    expect(report.summary.ends.A).toMatchObject({ cavities: 10, used: 2, plugsNeeded: 8 });
    expect(report.summary.ends.B).toMatchObject({ cavities: 6, used: 2, plugsNeeded: 0 });
    // Cavity 3 is documented as "signal" on both sheets.
    const mismatch = report.warnings.filter((f) => f.code === 'ROLE_MISMATCH');
    expect(mismatch.map((f) => [f.circuit, f.end, f.cavity])).toEqual([
      [1, 'A', '3'],
      [1, 'B', '3'],
    ]);
    // 26 AWG is thinner than the 22 AWG both sheets name as their smallest.
    expect(report.warnings.filter((f) => f.code === 'SIZE_OUT_OF_RANGE')).toHaveLength(2);
    expect(report.ok).toBe(true);
  });

  it('takes the sheet over anything typed on a linked end, and links by id as by slug', async () => {
    const id = await docId(MAP);
    const res = await anon.post('/api/adapters/check', {
      ends: {
        A: { connectorId: id, cavityCount: 40, roles: { '1': 'signal' }, sealed: false },
        B: { connectorId: MAP.toUpperCase() },
      },
      circuits: mapExtension().circuits,
    });
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(true);
    expect(res.body.summary.ends.A).toEqual({ cavities: 3, used: 3, unused: [], plugsNeeded: 0 });
    expect(codes(res.body.warnings)).not.toContain('ROLE_MISMATCH');
  });

  it('answers 200 with an END_MISSING error naming a sheet that is not published', async () => {
    const res = await anon.post('/api/adapters/check', {
      ends: { A: { connectorId: 'no-such-sheet' }, B: { connectorId: MAP } },
      circuits: mapExtension().circuits,
    });
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(false);
    const missing = res.body.errors.filter((f: Finding) => f.code === 'END_MISSING');
    expect(missing).toHaveLength(1);
    expect(missing[0]).toMatchObject({ end: 'A', field: 'connectorId' });
    expect(missing[0].message).toContain('"no-such-sheet"');
  });

  it('does not link a connector sheet that is only a draft', async () => {
    const draft = await author.post('/api/documents', {
      kind: 'connector',
      title: 'Unreviewed 3-way plug',
      content: { cavityCount: 3, view: 'mating-face' },
    });
    expect(draft.status).toBe(201);
    const res = await anon.post('/api/adapters/check', {
      ends: { A: { connectorId: draft.body.id }, B: { connectorId: MAP } },
      circuits: mapExtension().circuits,
    });
    expect(res.body.errors[0]).toMatchObject({ code: 'END_MISSING', end: 'A' });
    // The end described nothing of its own, so the check's own END_MISSING is replaced.
    expect(codes(res.body.errors).filter((c: string) => c === 'END_MISSING')).toHaveLength(1);
  });

  it('reads both linked sheets in one query', async () => {
    const harnessId = await docId(HARNESS6);
    const spy = vi.spyOn(env.ctx.sequelize, 'query');
    try {
      const resolved = await resolveAdapterLinks(env.ctx, {
        ends: { A: { connectorId: PUMP }, B: { connectorId: harnessId } },
        circuits: [],
      });
      // The outbox worker polls in the background; count only what touched documents.
      const ours = spy.mock.calls.filter(([sql]) => /documents|revisions/.test(String(sql)));
      expect(ours).toHaveLength(1);
      expect(resolved.missing).toEqual([]);
      expect(resolved.linked.A?.title).toMatch(/fuel pump module/);
      expect(resolved.linked.B?.cavities).toEqual(['1', '2', '3', '4', '5', '6']);
    } finally {
      spy.mockRestore();
    }
  });
});

describe('GET /api/connectors', () => {
  it('finds published connector sheets by title, component or tag', async () => {
    const res = await anon.get('/api/connectors?q=pump module');
    expect(res.status).toBe(200);
    expect(res.body.items.map((i: { slug: string }) => i.slug)).toContain(PUMP);
    const pump = res.body.items.find((i: { slug: string }) => i.slug === PUMP);
    expect(pump).toMatchObject({ cavities: 10, sealed: true, view: 'mating-face' });
    const tag = await anon.get('/api/connectors?q=quorvane sensor');
    expect(tag.body.items.length).toBeGreaterThan(2);
  });

  it('never lists drafts, and refuses a silly limit with a sentence', async () => {
    await author.post('/api/documents', {
      kind: 'connector',
      title: 'Zebrafinch draft plug',
      content: { cavityCount: 2 },
    });
    const res = await anon.get('/api/connectors?q=zebrafinch');
    expect(res.body.items).toEqual([]);
    const bad = await anon.get('/api/connectors?limit=500');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/limit/);
  });
});

describe('POST /api/documents/:id/submit for an adapter', () => {
  it('answers 422 CHECK_FAILED with the report when the pin table has errors', async () => {
    const content = mapExtension({
      circuits: [
        { a: ['1'], b: ['1'], role: '5 V reference' },
        { a: ['2'], b: ['1'], role: 'low reference' },
        { a: ['3'], b: [] },
      ],
    });
    const doc = await author.post('/api/documents', {
      kind: 'adapter',
      title: 'MAP sensor extension with mistakes',
      content,
    });
    expect(doc.status).toBe(201);
    const res = await author.post(`/api/documents/${doc.body.id}/submit`);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('CHECK_FAILED');
    expect(res.body.error.message).toMatch(/error/);
    const report = res.body.error.details.report as CheckReport;
    expect(report.ok).toBe(false);
    expect(codes(report.errors)).toEqual(
      expect.arrayContaining(['CAVITY_REUSED', 'OPEN_END', 'COUNT_MISMATCH']),
    );
    const reused = report.errors.find((f) => f.code === 'CAVITY_REUSED')!;
    expect(reused).toMatchObject({ circuit: 1, end: 'B', cavity: '1', field: 'b' });
    const editor = await author.get(`/api/documents/${doc.body.id}/editor`);
    expect(editor.body.revision.status).toBe('draft');
  });

  it('refuses a link to a sheet that is not published', async () => {
    const doc = await author.post('/api/documents', {
      kind: 'adapter',
      title: 'Extension to a sheet nobody reviewed',
      content: mapExtension({
        ends: { A: { connectorId: 'gone-sheet' }, B: { connectorId: MAP } },
      }),
    });
    const res = await author.post(`/api/documents/${doc.body.id}/submit`);
    expect(res.status).toBe(422);
    expect(res.body.error.details.report.errors[0]).toMatchObject({
      code: 'END_MISSING',
      end: 'A',
    });
  });

  it('submits a clean adapter, and the review page shows its check report as findings', async () => {
    const doc = await author.post('/api/documents', {
      kind: 'adapter',
      title: 'MAP sensor extension, 300 mm',
      content: mapExtension({ ends: { A: { connectorId: MAP }, B: { connectorId: CAM } } }),
    });
    expect(doc.status).toBe(201);
    // Cam sensor cavities are A, B, C: fix the table to them before submitting.
    const fixed = mapExtension({
      ends: { A: { connectorId: MAP }, B: { connectorId: CAM } },
      circuits: [
        { a: ['1'], b: ['A'], role: '5 V reference', size: '0.5 mm²', color: 'GY', lengthMm: 300 },
        { a: ['2'], b: ['C'], role: 'low reference', size: '0.5 mm²', color: 'BN/WH' },
        { a: ['3'], b: ['B'], role: 'signal', size: '0.5 mm²', color: 'GN/VT' },
      ],
    });
    const saved = await author.put(`/api/documents/${doc.body.id}/draft`, {
      title: 'MAP sensor extension, 300 mm',
      content: fixed,
      version: doc.body.revision.version,
    });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const sub = await author.post(`/api/documents/${doc.body.id}/submit`);
    expect(sub.status, JSON.stringify(sub.body)).toBe(200);
    expect(sub.body.revision.status).toBe('submitted');

    const review = await moderator.get(`/api/review/${sub.body.revision.id}`);
    expect(review.status).toBe(200);
    const findings = review.body.findings;
    expect(findings.ok).toBe(true);
    expect(findings.errors).toEqual([]);
    // The review's findings are the check report: the same errors and warnings.
    expect(findings.report.warnings).toEqual(findings.warnings);
    expect(findings.report.summary.ends.B.cavities).toBe(3);
    expect(findings.linked.A.slug).toBe(MAP);
    expect(findings.linked.B.slug).toBe(CAM);
    const clean = review.body.checklist.find((i: { key: string }) => i.key === 'checks-clean');
    expect(clean.ok).toBe(true);
    const view = review.body.checklist.find((i: { key: string }) => i.key === 'view-side');
    expect(view.ok).toBe(true);
  });
});

describe('the demo adapters', () => {
  it('publishes four adapter sheets that build as written, and one draft with mistakes', async () => {
    const { Document, Revision } = env.ctx.models;
    const docs = await Document.findAll({ where: { kind: 'adapter' } });
    const owned = docs.filter((d) => d.publishedRevisionId);
    expect(owned.length).toBeGreaterThanOrEqual(4);
    const reader = new LoggedClient(env.app);
    for (const doc of owned) {
      const view = await reader.get(`/api/documents/${doc.slug}`);
      expect(view.status).toBe(200);
      expect(
        view.body.findings.ok,
        `${doc.slug}: ${JSON.stringify(view.body.findings.errors)}`,
      ).toBe(true);
      expect(view.body.revision.reviewer).toBeTruthy();
    }
    const all = await Promise.all(
      owned.map(async (d) => (await reader.get(`/api/documents/${d.slug}`)).body),
    );
    const summaries = all.map((v) => v.findings.report.summary);
    expect(
      summaries.some((s) => s.splices > 0),
      'a spliced ground',
    ).toBe(true);
    expect(
      summaries.some((s) => s.ends.A.plugsNeeded > 0 && s.ends.A.cavities > s.ends.B.cavities),
      'a larger-to-smaller conversion with plugs',
    ).toBe(true);
    expect(
      all.some((v) => v.findings.warnings.some((f: Finding) => f.code === 'TERMINATED')),
      'a wire leaving through a ring terminal',
    ).toBe(true);

    const member = await env.ctx.models.User.findOne({ where: { email: 'member@example.test' } });
    const drafts = docs.filter((d) => !d.publishedRevisionId && d.ownerId === member!.id);
    expect(drafts).toHaveLength(1);
    const rev = await Revision.findOne({ where: { documentId: drafts[0].id } });
    expect(rev!.status).toBe('draft');
    const mine = new LoggedClient(env.app);
    await mine.token();
    await mine.signIn('member@example.test');
    const submit = await mine.post(`/api/documents/${drafts[0].id}/submit`);
    expect(submit.status).toBe(422);
    expect(codes(submit.body.error.details.report.errors)).toEqual(
      expect.arrayContaining(['CAVITY_REUSED', 'OPEN_END']),
    );
  });
});
