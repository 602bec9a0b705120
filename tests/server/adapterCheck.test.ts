import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import fc from 'fast-check';
import { createTestEnv, type TestEnv } from '../helpers/context';

let env: TestEnv;
beforeAll(async () => {
  env = await createTestEnv();
});
afterAll(() => env.close());

const example = {
  systemVoltage: 12,
  ends: {
    A: {
      label: '10-cavity pump module plug',
      cavities: ['1', '2', '3', '4', '5', '6', '7', '8', '9', '10'],
      sealed: true,
      roles: { '1': 'motor +', '2': 'motor -' },
      wireSize: { min: '22 AWG', max: '18 AWG' },
    },
    B: { label: '7-cavity body harness plug', cavityCount: 7, sealed: false },
  },
  circuits: [
    {
      a: ['1'],
      b: ['1'],
      role: 'motor +',
      size: '18 AWG',
      color: 'RD/WH',
      lengthMm: 250,
      currentA: 3,
    },
    { a: ['7'], b: [], termination: 'ring terminal to engine ground' },
  ],
};

describe('POST /api/adapters/check', () => {
  it('answers 200 with the report, without a CSRF token or a session', async () => {
    const res = await request(env.app).post('/api/adapters/check').send(example);
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(true);
    expect(res.body.errors).toEqual([]);
    expect(res.body.summary).toEqual({
      circuits: 2,
      splices: 0,
      ends: {
        A: {
          cavities: 10,
          used: 2,
          unused: ['2', '3', '4', '5', '6', '8', '9', '10'],
          plugsNeeded: 8,
        },
        B: { cavities: 7, used: 1, unused: ['2', '3', '4', '5', '6', '7'], plugsNeeded: 0 },
      },
      landed: { A: 2, B: 1 },
    });
    expect(res.body.warnings).toContainEqual(
      expect.objectContaining({ code: 'TERMINATED', circuit: 1, end: 'B' }),
    );
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('answers 200 with OPEN_END and COUNT_MISMATCH when the termination is dropped', async () => {
    const body = structuredClone(example);
    delete (body.circuits[1] as { termination?: string }).termination;
    const res = await request(env.app).post('/api/adapters/check').send(body);
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(false);
    const codes = res.body.errors.map((e: { code: string }) => e.code);
    expect(codes).toContain('OPEN_END');
    expect(codes).toContain('COUNT_MISMATCH');
    for (const e of res.body.errors) expect(e.message).toMatch(/\w+ \w+ \w+/);
  });

  it.each([
    ['a list', []],
    ['a string', 'hello'],
    ['circuits that are not a list', { ends: example.ends, circuits: 'all of them' }],
    ['a cavity list holding objects', { ends: example.ends, circuits: [{ a: [{}], b: ['1'] }] }],
  ])('answers 400 with a sentence for %s', async (_name, body) => {
    const res = await request(env.app)
      .post('/api/adapters/check')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify(body));
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/\w+ \w+ \w+/);
  });

  it('never answers 500, whatever JSON it gets', async () => {
    await fc.assert(
      fc.asyncProperty(fc.jsonValue({ maxDepth: 4 }), async (value) => {
        const res = await request(env.app)
          .post('/api/adapters/check')
          .set('Content-Type', 'application/json')
          .send(JSON.stringify(value));
        expect([200, 400]).toContain(res.status);
      }),
      { numRuns: 150 },
    );
  });
});
