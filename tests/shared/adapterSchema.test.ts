import { describe, expect, it } from 'vitest';
import {
  adapterCheckInputSchema,
  describeInputIssue,
  isWellFormedAdapterInput,
  parseAdapterCheckInput,
} from '@shared/schemas/adapter';

describe('adapter check body', () => {
  it('accepts the lenient shapes the check turns into findings', () => {
    for (const body of [
      {},
      { circuits: [] },
      { ends: null, circuits: null },
      { ends: { A: null } },
      { ends: { A: { cavities: [] } }, circuits: [{}] },
      { circuits: [{ a: '1', b: 2, size: 18, color: 'sky', termination: '' }] },
      { ends: { A: { roles: { '1': null } } } },
    ]) {
      expect(parseAdapterCheckInput(body).ok).toBe(true);
      expect(isWellFormedAdapterInput(body)).toBe(true);
    }
  });

  it('refuses wrong JSON types with a readable message and the path', () => {
    const r = parseAdapterCheckInput({ circuits: [{ a: ['1'] }, { a: [{ cavity: 1 }] }] });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0]).toEqual({
      path: 'circuits[1].a',
      message: expect.stringMatching(/list of cavity labels/),
    });
    expect(r.message).toMatch(
      /^The adapter cannot be checked because the request is not in the expected shape\./,
    );
    expect(r.message).toMatch(/circuits\[1\]\.a: must be a list of cavity labels/);
  });

  it.each([
    [null, /body must be a JSON object/],
    [[], /body must be a JSON object/],
    [{ systemVoltage: 0 }, /systemVoltage must be above 0/],
    [{ systemVoltage: '12' }, /systemVoltage must be a number/],
    [{ ends: [] }, /ends must be an object/],
    [{ ends: { A: { cavityCount: 20000 } } }, /cavityCount can be at most 10000/],
    [{ ends: { A: { cavityCount: -1 } } }, /cavityCount cannot be negative/],
    [{ ends: { A: { roles: ['signal'] } } }, /roles must be an object/],
    [{ ends: { A: { wireSize: '18 AWG' } } }, /wireSize must be an object/],
    [
      { ends: { A: { layout: { rows: 0, cols: 2 } } } },
      /layout.rows must be a whole number above 0/,
    ],
    [{ circuits: [{ currentA: -1 }] }, /currentA cannot be negative/],
    [{ circuits: [{ role: 5 }] }, /role must be text/],
  ])('refuses %j', (body, message) => {
    const r = parseAdapterCheckInput(body);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(message);
    expect(isWellFormedAdapterInput(body)).toBe(false);
  });

  it('drops unknown keys', () => {
    const r = adapterCheckInputSchema.parse({ title: 'x', circuits: [{ a: ['1'], colour: 'RD' }] });
    expect(r).toEqual({ circuits: [{ a: ['1'] }] });
  });

  it('writes an issue as one sentence', () => {
    expect(
      describeInputIssue({
        path: ['circuits', 2, 'lengthMm'],
        message: 'lengthMm cannot be negative',
      }),
    ).toBe('circuits[2]: lengthMm cannot be negative.');
    expect(describeInputIssue({ path: [], message: 'the body must be a JSON object' })).toBe(
      'The body must be a JSON object.',
    );
  });
});
