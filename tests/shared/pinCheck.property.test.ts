import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkAdapter, reverseEnds, type CheckReport, type Finding } from '@shared/check';
import {
  adapterCheckInputSchema,
  checkReportSchema,
  isWellFormedAdapterInput,
  parseAdapterCheckInput,
} from '@shared/schemas/adapter';
import { checkParsedAdapter } from '@shared/check';

const labelPool = ['1', '2', '3', '4', '5', '6', 'A', 'B', 'c', 'X1', ' 2 ', 'a'];
const label = fc.oneof(fc.constantFrom(...labelPool), fc.integer({ min: 1, max: 8 }));

const endArb = fc.oneof(
  { weight: 1, arbitrary: fc.constant(undefined) },
  {
    weight: 8,
    arbitrary: fc.record(
      {
        label: fc.constantFrom('6-cavity sensor plug', '8-cavity sealed plug', ''),
        cavities: fc.array(label, { maxLength: 10 }),
        cavityCount: fc.integer({ min: 0, max: 10 }),
        sealed: fc.boolean(),
        roles: fc.dictionary(
          fc.constantFrom('1', '2', '3', 'A', 'b', '9'),
          fc.constantFrom('signal', 'ground', 'motor +', 'motor −', 'Motor -', ''),
        ),
        wireSize: fc.record(
          {
            min: fc.constantFrom('22 AWG', '0.5 mm2', 'odd'),
            max: fc.constantFrom('16 AWG', '1 mm²'),
          },
          { requiredKeys: [] },
        ),
      },
      { requiredKeys: [] },
    ),
  },
);

const circuitArb = fc.record(
  {
    a: fc.oneof(fc.array(label, { maxLength: 3 }), label),
    b: fc.array(label, { maxLength: 3 }),
    termination: fc.constantFrom('ring terminal to ground', '', '  '),
    size: fc.constantFrom('18 AWG', '20 AWG', '4/0 AWG', '0.75 mm2', 'huge', '', 18),
    color: fc.constantFrom('RD', 'GN/YE', 'green', 'LTGRN', ''),
    role: fc.constantFrom('signal', 'ground', 'motor -', 'MOTOR −', ''),
    lengthMm: fc.integer({ min: 0, max: 20_000 }),
    currentA: fc.double({ min: 0, max: 60, noNaN: true }),
    note: fc.string(),
  },
  { requiredKeys: [] },
);

const adapterArb = fc.record(
  {
    systemVoltage: fc.constantFrom(6, 12, 24, 48),
    ends: fc.record({ A: endArb, B: endArb }, { requiredKeys: [] }),
    circuits: fc.array(circuitArb, { maxLength: 14 }),
  },
  { requiredKeys: [] },
);

/** A valid adapter with some fields replaced by arbitrary values. */
const corruptedArb = adapterArb.chain((input) =>
  fc
    .record({
      path: fc.constantFrom(
        'systemVoltage',
        'ends',
        'ends.A',
        'ends.A.cavities',
        'ends.B.roles',
        'circuits',
        'circuits.0',
        'circuits.0.a',
        'circuits.0.lengthMm',
      ),
      value: fc.anything(),
    })
    .map(({ path, value }) => {
      const copy = structuredClone(input) as Record<string, unknown>;
      const keys = path.split('.');
      let node: Record<string, unknown> | undefined = copy;
      for (const key of keys.slice(0, -1)) {
        const next: unknown = node?.[key];
        node = next && typeof next === 'object' ? (next as Record<string, unknown>) : undefined;
      }
      if (node) node[keys[keys.length - 1]] = value;
      return copy;
    }),
);

const swapEnd = (e: Finding['end']) => (e === 'A' ? 'B' : e === 'B' ? 'A' : e);
const swapField = (f: string | undefined) => (f === 'a' ? 'b' : f === 'b' ? 'a' : f);

function signature(f: Finding, swap: boolean): string {
  return JSON.stringify([
    f.code,
    f.severity,
    f.circuit,
    swap ? swapEnd(f.end) : f.end,
    f.cavity,
    swap ? swapField(f.field) : f.field,
  ]);
}

const signatures = (fs: Finding[], swap = false) => fs.map((f) => signature(f, swap)).sort();

function expectWellFormedReport(r: CheckReport) {
  expect(checkReportSchema.safeParse(r).success).toBe(true);
  for (const f of r.errors) expect(f.severity).toBe('error');
  for (const f of r.warnings) expect(f.severity).toBe('warning');
}

describe('pin-check properties', () => {
  it('used + unused = cavities on each end, and plugs only on sealed ends', () => {
    fc.assert(
      fc.property(adapterArb, (input) => {
        const r = checkAdapter(input);
        for (const side of ['A', 'B'] as const) {
          const s = r.summary.ends[side];
          expect(s.used + s.unused.length).toBe(s.cavities);
          expect(new Set(s.unused.map((l) => l.toLowerCase())).size).toBe(s.unused.length);
          const sealed = input.ends?.[side]?.sealed === true;
          expect(s.plugsNeeded).toBe(sealed ? s.unused.length : 0);
          const unusedWarnings = r.warnings.filter(
            (w) => w.code === 'CAVITY_UNUSED' && w.end === side,
          );
          expect(unusedWarnings.map((w) => w.cavity)).toEqual(s.unused);
        }
        expect(r.summary.circuits).toBe(input.circuits?.length ?? 0);
      }),
      { numRuns: 400 },
    );
  });

  it('ok exactly when there are no errors', () => {
    fc.assert(
      fc.property(fc.oneof(adapterArb, corruptedArb), (input) => {
        const r = checkAdapter(input);
        expect(r.ok).toBe(r.errors.length === 0);
        expectWellFormedReport(r);
      }),
      { numRuns: 400 },
    );
  });

  it('reversing the ends swaps per-end results and changes nothing else', () => {
    fc.assert(
      fc.property(adapterArb, (input) => {
        const r = checkAdapter(input);
        const rr = checkAdapter(reverseEnds(input));
        expect(rr.ok).toBe(r.ok);
        expect(rr.summary.circuits).toBe(r.summary.circuits);
        expect(rr.summary.splices).toBe(r.summary.splices);
        expect(rr.summary.ends).toEqual({ A: r.summary.ends.B, B: r.summary.ends.A });
        expect(rr.summary.landed).toEqual({ A: r.summary.landed.B, B: r.summary.landed.A });
        expect(signatures(rr.errors)).toEqual(signatures(r.errors, true));
        expect(signatures(rr.warnings)).toEqual(signatures(r.warnings, true));
      }),
      { numRuns: 400 },
    );
  });

  it('never throws on any value', () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.anything({ withNullPrototype: true, withObjectString: true, withSparseArray: true }),
          fc.jsonValue(),
          corruptedArb,
        ),
        (value) => {
          const r = checkAdapter(value);
          expectWellFormedReport(r);
        },
      ),
      { numRuns: 600 },
    );
  });

  it('answers INPUT_INVALID exactly when the schema refuses the body', () => {
    fc.assert(
      fc.property(fc.oneof(fc.jsonValue(), corruptedArb, adapterArb), (value) => {
        const r = checkAdapter(value);
        const parsed = parseAdapterCheckInput(value);
        const invalid = r.errors.some((f) => f.code === 'INPUT_INVALID');
        expect(invalid).toBe(!parsed.ok);
        if (!parsed.ok) expect(parsed.message.length).toBeGreaterThan(20);
      }),
      { numRuns: 500 },
    );
  });

  it('the fast shape test never accepts what the schema refuses, and gives the same report', () => {
    fc.assert(
      fc.property(
        fc.oneof(
          adapterArb,
          corruptedArb,
          fc.anything({ withNullPrototype: true }),
          fc.jsonValue(),
        ),
        (value) => {
          const parsed = adapterCheckInputSchema.safeParse(value);
          if (isWellFormedAdapterInput(value)) {
            expect(parsed.success).toBe(true);
            if (parsed.success)
              expect(checkParsedAdapter(value)).toEqual(checkParsedAdapter(parsed.data));
          }
        },
      ),
      { numRuns: 800 },
    );
  });

  it('the fast shape test accepts every generated well-formed adapter', () => {
    fc.assert(
      fc.property(adapterArb, (value) => {
        expect(isWellFormedAdapterInput(value)).toBe(true);
      }),
      { numRuns: 200 },
    );
  });
});
