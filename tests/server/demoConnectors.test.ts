import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, createTestEnv, type TestEnv } from '../helpers/context';
import { DEMO_CONNECTOR_SLUGS, demoConnector } from '../../server/seed/connectors';
import { connectorContentSchema } from '../../shared/schemas/connector';

let env: TestEnv;
let moderator: Client;
let member: Client;

beforeAll(async () => {
  env = await createTestEnv({ seedDemo: true });
  moderator = new Client(env.app);
  await moderator.signIn('moderator@example.test');
  member = new Client(env.app);
  await member.signIn('member@example.test');
});
afterAll(() => env.close());

describe('the demo connector sheets', () => {
  it('publishes a dozen sheets, reviewed by the demo moderator, that check clean', async () => {
    const slugs = Object.values(DEMO_CONNECTOR_SLUGS);
    expect(slugs).toHaveLength(12);
    for (const slug of slugs) {
      const res = await new Client(env.app).get(`/api/documents/${slug}`);
      expect(res.status, slug).toBe(200);
      expect(connectorContentSchema.safeParse(res.body.content).success, slug).toBe(true);
      expect(res.body.revision.reviewer.displayName).toBe('Moss Tarrow');
      expect(res.body.findings.errors, slug).toEqual([]);
      expect(res.body.findings.warnings, slug).toEqual([]);
    }
    const fan = await new Client(env.app).get(`/api/documents/${DEMO_CONNECTOR_SLUGS.coolingFan}`);
    expect(fan.body.findings.cautions).toEqual(['high-current']);
    const pump = await new Client(env.app).get(`/api/documents/${DEMO_CONNECTOR_SLUGS.pumpModule}`);
    expect(pump.body.findings.cautions).toContain('fuel');
  });

  it('leaves two submissions in the queue, one of them the next revision of a published sheet', async () => {
    const queue = await moderator.get('/api/review/queue?kind=connector');
    expect(queue.status).toBe(200);
    expect(queue.body).toHaveLength(2);
    const update = queue.body.find(
      (q: { slug: string }) => q.slug === DEMO_CONNECTOR_SLUGS.coolantSensor,
    );
    expect(update).toMatchObject({ number: 2, isUpdate: true, claimedBy: null });
    const review = await moderator.get(`/api/review/${update.revisionId}`);
    const changed = review.body.diff.rows.pins.filter(
      (r: { status: string }) => r.status !== 'same',
    );
    expect(changed.map((r: { key: string }) => r.key)).toEqual(['cavity:c']);
    const page = await new Client(env.app).get(
      `/api/documents/${DEMO_CONNECTOR_SLUGS.coolantSensor}`,
    );
    expect(page.body.revision).toMatchObject({ number: 1, status: 'published' });
  });

  it('returns one sheet to member@example.test with a note', async () => {
    const mine = await member.get('/api/me/documents');
    const returned = mine.body.filter(
      (d: { latest: { status: string } }) => d.latest.status === 'returned',
    );
    expect(returned).toHaveLength(1);
    expect(returned[0].latest.note).toMatch(/viewed from/);
    expect(mine.body.filter((d: { published: boolean }) => d.published)).toHaveLength(2);
  });

  it('lets other demo steps find a sheet by its key', async () => {
    const pump = await demoConnector(env.ctx, 'pumpModule');
    expect(pump.slug).toBe(DEMO_CONNECTOR_SLUGS.pumpModule);
    expect(pump.content.cavityCount).toBe(10);
  });

  it('writes the moderator’s decisions to the audit log', async () => {
    const { AuditEntry, Revision } = env.ctx.models;
    const connectorRevisions = (
      await Revision.findAll({ where: { kind: 'connector' }, attributes: ['id'] })
    ).map((r) => String(r.id));
    const count = (action: string) =>
      AuditEntry.count({ where: { action, targetType: 'revision', targetId: connectorRevisions } });
    expect(await count('review.publish')).toBe(12);
    expect(await count('review.return')).toBe(1);
  });
});
