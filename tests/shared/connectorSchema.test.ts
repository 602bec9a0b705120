import { describe, expect, it } from 'vitest';
import {
  connectorContentSchema,
  emptyConnectorContent,
  MAX_CONNECTOR_CAVITIES,
} from '../../shared/schemas/connector';
import {
  createDocumentSchema,
  declineDecisionSchema,
  publishDecisionSchema,
  returnDecisionSchema,
  reviewQueueQuerySchema,
  revisionQuerySchema,
  saveDraftSchemaFor,
} from '../../shared/schemas/document';

const paths = (r: { success: boolean; error?: { issues: Array<{ path: PropertyKey[] }> } }) =>
  (r.error?.issues ?? []).map((i) => i.path.join('.'));

describe('connectorContentSchema', () => {
  it('accepts the example content of the API description', () => {
    const r = connectorContentSchema.safeParse({
      cavities: ['A', 'B', 'C'],
      layout: { rows: 1, cols: 3 },
      housing: 'socket',
      view: 'wire-side',
      sealed: true,
      component: 'coolant temperature sensor',
      tags: ['invented platform 4.2'],
      wireSize: { min: '22 AWG', max: '18 AWG' },
      pins: [
        { cavity: 'A', role: '5 V reference', color: 'GY', size: '20 AWG', circuit: '', note: '' },
      ],
    });
    expect(r.success).toBe(true);
  });

  it('accepts drafts that are not finished: blank enums, blank cells, nulls, an empty object', () => {
    expect(connectorContentSchema.safeParse({}).success).toBe(true);
    expect(connectorContentSchema.safeParse(emptyConnectorContent()).success).toBe(true);
    const r = connectorContentSchema.safeParse({
      cavityCount: 4,
      labels: '',
      housing: '',
      view: null,
      layout: { rows: null, cols: 2 },
      pins: [{ cavity: '' }, { cavity: '9', role: '', color: 'not a colour', size: 'thick' }],
    });
    expect(r.success, JSON.stringify(r.error?.issues)).toBe(true);
  });

  it('accepts labelled positions and terminal sizes as free text', () => {
    const r = connectorContentSchema.safeParse({
      cavities: ['A', 'B', 'C'],
      labels: 'custom',
      layout: {
        rows: 2,
        cols: 2,
        positions: [
          { label: 'A', row: 0, col: 0 },
          { label: 'B', row: 0, col: 1 },
          { label: 'C', row: 1, col: 0 },
        ],
      },
      terminalSize: '1.5 mm blade',
    });
    expect(r.success).toBe(true);
  });

  it('refuses unknown fields and wrong types, naming the field', () => {
    expect(paths(connectorContentSchema.safeParse({ colour: 'RD' }))).toEqual(['']);
    expect(connectorContentSchema.safeParse({ colour: 'RD' }).error!.issues[0]).toMatchObject({
      code: 'unrecognized_keys',
      keys: ['colour'],
    });
    expect(
      paths(connectorContentSchema.safeParse({ pins: [{ cavity: 'A', colour: 'RD' }] })),
    ).toEqual(['pins.0']);
    expect(paths(connectorContentSchema.safeParse({ view: 'front' }))).toEqual(['view']);
    expect(paths(connectorContentSchema.safeParse({ housing: 'male' }))).toEqual(['housing']);
    expect(paths(connectorContentSchema.safeParse({ labels: 'roman' }))).toEqual(['labels']);
    expect(paths(connectorContentSchema.safeParse({ sealed: 'yes' }))).toEqual(['sealed']);
    expect(paths(connectorContentSchema.safeParse({ cavityCount: 2.5 }))).toEqual(['cavityCount']);
    expect(paths(connectorContentSchema.safeParse({ layout: { rows: 0, cols: 3 } }))).toEqual([
      'layout.rows',
    ]);
    expect(paths(connectorContentSchema.safeParse({ pins: [{ role: 'signal' }] }))).toEqual([
      'pins.0.cavity',
    ]);
    expect(paths(connectorContentSchema.safeParse({ wireSize: { min: 22 } }))).toEqual([
      'wireSize.min',
    ]);
  });

  it(`refuses more than ${MAX_CONNECTOR_CAVITIES} cavities and over-long text`, () => {
    const many = Array.from({ length: MAX_CONNECTOR_CAVITIES + 1 }, (_, i) => String(i + 1));
    expect(
      connectorContentSchema.safeParse({ cavities: many.slice(0, MAX_CONNECTOR_CAVITIES) }).success,
    ).toBe(true);
    expect(paths(connectorContentSchema.safeParse({ cavities: many }))).toEqual(['cavities']);
    expect(
      paths(connectorContentSchema.safeParse({ cavityCount: MAX_CONNECTOR_CAVITIES + 1 })),
    ).toEqual(['cavityCount']);
    expect(
      paths(connectorContentSchema.safeParse({ pins: many.map((cavity) => ({ cavity })) })),
    ).toEqual(['pins']);
    expect(
      paths(connectorContentSchema.safeParse({ pins: [{ cavity: 'A', note: 'x'.repeat(501) }] })),
    ).toEqual(['pins.0.note']);
    expect(paths(connectorContentSchema.safeParse({ component: 'x'.repeat(121) }))).toEqual([
      'component',
    ]);
  });
});

describe('document request schemas', () => {
  it('checks content against the schema of the kind', () => {
    expect(
      createDocumentSchema.safeParse({
        kind: 'connector',
        title: 'A',
        content: { view: 'wire-side' },
      }).success,
    ).toBe(true);
    expect(
      paths(
        createDocumentSchema.safeParse({ kind: 'connector', title: 'A', content: { body: '# x' } }),
      ),
    ).toEqual(['content']);
    expect(
      createDocumentSchema.safeParse({ kind: 'writeup', title: 'A', content: { body: '# x' } })
        .success,
    ).toBe(true);
    expect(
      paths(createDocumentSchema.safeParse({ kind: 'writeup', title: 'A', content: { body: 5 } })),
    ).toEqual(['content.body']);
    expect(
      createDocumentSchema.safeParse({
        kind: 'adapter',
        title: 'A',
        content: { ends: {}, circuits: [] },
      }).success,
    ).toBe(true);
    expect(
      paths(
        createDocumentSchema.safeParse({
          kind: 'adapter',
          title: 'A',
          content: { circuits: 'none' },
        }),
      ),
    ).toEqual(['content.circuits']);
    expect(
      paths(createDocumentSchema.safeParse({ kind: 'poster', title: 'A', content: {} })),
    ).toEqual(['kind']);
    expect(
      paths(createDocumentSchema.safeParse({ kind: 'connector', title: '   ', content: {} })),
    ).toEqual(['title']);
    expect(
      paths(
        createDocumentSchema.safeParse({ kind: 'connector', title: 'A', content: {}, owner: 1 }),
      ),
    ).toEqual(['']);
  });

  it('lets a draft save keep a blank title but needs the version', () => {
    const s = saveDraftSchemaFor('connector');
    expect(s.safeParse({ title: '', content: {}, version: 3 }).success).toBe(true);
    expect(paths(s.safeParse({ title: '', content: {} }))).toEqual(['version']);
    expect(paths(s.safeParse({ title: 'x', content: {}, version: -1 }))).toEqual(['version']);
  });

  it('needs a note to return or decline, not to publish', () => {
    expect(publishDecisionSchema.safeParse({}).success).toBe(true);
    expect(publishDecisionSchema.safeParse({ note: 'Thanks' }).success).toBe(true);
    for (const s of [returnDecisionSchema, declineDecisionSchema]) {
      expect(s.safeParse({}).success).toBe(false);
      expect(s.safeParse({ note: '   ' }).success).toBe(false);
      expect(s.parse({ note: '  Add the view side.  ' })).toEqual({ note: 'Add the view side.' });
    }
  });

  it('reads the queue and revision query strings', () => {
    expect(reviewQueueQuerySchema.parse({ kind: '' })).toEqual({ kind: undefined });
    expect(reviewQueueQuerySchema.parse({ kind: 'adapter' })).toEqual({ kind: 'adapter' });
    expect(reviewQueueQuerySchema.safeParse({ kind: 'poster' }).success).toBe(false);
    expect(revisionQuerySchema.parse({ revision: '3' })).toEqual({ revision: 3 });
    expect(revisionQuerySchema.safeParse({ revision: '0' }).success).toBe(false);
    expect(revisionQuerySchema.safeParse({ revision: 'x' }).success).toBe(false);
  });
});
