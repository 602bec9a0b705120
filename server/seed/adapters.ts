/**
 * Demo adapter sheets in the invented scenario of the connector demo (the Brindlemoor 4.2
 * and 3.6 platforms, the Quorvane T3 engine), linking the published demo connector
 * sheets: a one-to-one extension, a larger-to-smaller conversion with plugged cavities,
 * one with a spliced ground, one with a wire that leaves through a ring terminal, and a
 * draft by member@ with deliberate mistakes so a new user sees the check at work.
 * Nothing here names a real make, model, brand, part number or person.
 */
import type { AppContext } from '../context';
import type { AdapterEnd, AdapterInput, CircuitInput } from '../../shared/schemas/adapter';
import { fillLinkedEnd, linkedSheetOf } from '../../shared/adapter/linkedEnd';
import { slugify } from '../services/documents';
import type { DemoUsers } from './demo';
import { demoConnector, type DemoConnectorKey } from './connectors';
import { seedDocument } from './documents';

type Wire = [
  a: string[],
  b: string[],
  role: string,
  size: string,
  color: string,
  lengthMm: number,
  extra?: Partial<CircuitInput>,
];

const wires = (rows: Wire[]): CircuitInput[] =>
  rows.map(([a, b, role, size, color, lengthMm, extra], i) => ({
    id: `w${i + 1}`,
    a,
    b,
    role,
    size,
    color,
    lengthMm,
    ...extra,
  }));

/** An end linked to a demo sheet, filled in the way the editor fills it. */
async function linked(ctx: AppContext, key: DemoConnectorKey, label?: string): Promise<AdapterEnd> {
  const sheet = await demoConnector(ctx, key);
  const info = linkedSheetOf({ id: sheet.id, slug: sheet.slug }, sheet.title, sheet.content);
  return fillLinkedEnd({ connectorId: sheet.id, label: label ?? sheet.title }, info);
}

interface DemoAdapter {
  title: string;
  content: AdapterInput;
}

/** The published adapters, built once the connector sheets exist. */
async function publishedAdapters(ctx: AppContext): Promise<DemoAdapter[]> {
  return [
    {
      title: 'Quorvane T3 camshaft sensor extension, 3-way, 400 mm',
      content: {
        systemVoltage: 12,
        ends: {
          A: await linked(ctx, 'camSensor', 'Engine harness plug (to the control module)'),
          B: await linked(ctx, 'camSensor', 'Camshaft sensor, relocated to the front cover'),
        },
        circuits: wires([
          [['A'], ['A'], '5 V reference', '0.5 mm²', 'GY', 400],
          [
            ['B'],
            ['B'],
            'signal',
            '0.5 mm²',
            'YE/BU',
            400,
            { note: 'Twist with the low reference' },
          ],
          [['C'], ['C'], 'low reference', '0.5 mm²', 'BN/WH', 400],
        ]),
      },
    },
    {
      title:
        'Brindlemoor 4.2 fuel pump module into the Brindlemoor 3.6 body harness, 10-way to 6-way',
      content: {
        systemVoltage: 12,
        ends: {
          A: await linked(ctx, 'pumpModule', 'Brindlemoor 4.2 fuel pump module plug'),
          B: await linked(ctx, 'bodyHarness6', 'Brindlemoor 3.6 rear body harness plug'),
        },
        circuits: wires([
          [
            ['1'],
            ['1'],
            'motor +',
            '14 AWG',
            'GY',
            300,
            { currentA: 8, note: '15 A fuse stays in the body harness' },
          ],
          [
            ['2'],
            ['2'],
            'ground',
            '14 AWG',
            'BK',
            300,
            { currentA: 8, note: 'The module calls it motor −; on the 3.6 it is body ground 1050' },
          ],
          [['3'], ['3'], 'signal', '20 AWG', 'VT/WH', 300, { note: 'Fuel level sender' }],
          [['4'], ['4'], 'low reference', '20 AWG', 'BK/VT', 300],
        ]),
      },
    },
    {
      title: 'Quorvane T3 control module C2 to an 8-way engine bay bulkhead, spliced ground',
      content: {
        systemVoltage: 12,
        ends: {
          A: await linked(ctx, 'controlModule12', 'Engine control module plug C2'),
          B: {
            label: '8-way sealed bulkhead plug, engine bay side',
            cavityCount: 8,
            sealed: true,
            view: 'wire-side',
            layout: { rows: 2, cols: 4 },
            wireSize: { min: '0.35 mm²', max: '1.5 mm²' },
          },
        },
        circuits: wires([
          [
            ['1'],
            ['1'],
            'battery feed',
            '1 mm²',
            'RD',
            650,
            { currentA: 2, note: '10 A fuse at the battery' },
          ],
          [['2'], ['2'], 'switched ignition feed', '0.75 mm²', 'RD/GN', 650],
          [
            ['3', '4'],
            ['3'],
            'ground',
            '1.5 mm²',
            'BK',
            650,
            {
              currentA: 6,
              note: 'Both module grounds joined in one crimp splice, then one wire to the stud',
            },
          ],
          [
            ['5'],
            ['4'],
            'serial data high',
            '0.5 mm²',
            'WH/BU',
            650,
            { note: 'Twisted pair with circuit 5' },
          ],
          [['6'], ['5'], 'serial data low', '0.5 mm²', 'WH/GN', 650],
          [['7'], ['6'], '5 V reference', '0.5 mm²', 'GY', 650],
          [['8'], ['7'], 'low reference', '0.5 mm²', 'BN/WH', 650],
          [['9'], ['8'], 'signal', '0.5 mm²', 'GN/VT', 650, { note: 'Manifold absolute pressure' }],
        ]),
      },
    },
    {
      title:
        'Brindlemoor 4.2 cooling fan pigtail, feed through a 1-way plug, ground to a ring terminal',
      content: {
        systemVoltage: 12,
        ends: {
          A: await linked(ctx, 'coolingFan', 'Radiator cooling fan plug'),
          B: {
            label: '1-way sealed feed plug from the fan relay',
            cavityCount: 1,
            sealed: true,
            view: 'wire-side',
            layout: { rows: 1, cols: 1 },
            wireSize: { min: '12 AWG', max: '10 AWG' },
          },
        },
        circuits: wires([
          [
            ['A'],
            ['1'],
            'motor +',
            '10 AWG',
            'RD',
            600,
            { currentA: 25, note: '40 A fuse at the relay' },
          ],
          [
            ['B'],
            [],
            'ground',
            '10 AWG',
            'BK',
            400,
            { currentA: 25, termination: 'ring terminal (M6) to the front ground stud' },
          ],
        ]),
      },
    },
  ];
}

/** The draft member@ finds in My documents: it does not build as written. */
async function draftWithMistakes(ctx: AppContext): Promise<DemoAdapter> {
  return {
    title: 'Quorvane T3 throttle body extension, 6-way',
    content: {
      systemVoltage: 12,
      ends: {
        A: await linked(ctx, 'throttleBody', 'Engine harness plug'),
        B: await linked(ctx, 'throttleBody', 'Throttle body'),
      },
      circuits: wires([
        [['1'], ['1'], 'motor +', '0.75 mm²', 'VT/WH', 350],
        [['2'], ['2'], 'motor −', '0.75 mm²', 'VT/BK', 350],
        [['3'], ['3'], '5 V reference', '0.5 mm²', 'GY/RD', 350],
        [['4'], ['4'], 'signal', '0.5 mm²', 'GN', 350],
        // Typed 4 again instead of 5: a cavity holds one terminal.
        [['5'], ['4'], 'low reference', '0.5 mm²', 'BN/WH', 350],
        // The second position signal was never given its cavity on end B.
        [['6'], [], 'signal', '0.5 mm²', 'GN/BU', 350],
      ]),
    },
  };
}

/** The demo step: four published adapter sheets and member@'s draft with mistakes. */
export async function seedAdapters(ctx: AppContext, users: DemoUsers) {
  const mod = users['moderator@example.test'];
  const authors = [
    users['member2@example.test'],
    users['pell.marrow@example.test'],
    users['sable.wren@example.test'],
    users['tobin.arkwell@example.test'],
  ];
  const notes = [
    'Checked the pin order against both sheets.',
    'Six cavity plugs on the module side: listed on the build sheet.',
    'Splice and bulkhead order checked; the feed is fused at the battery.',
    'Ring terminal ground is fine; the 10 AWG feed is within both ranges.',
  ];
  const adapters = await publishedAdapters(ctx);
  let daysAgo = 20;
  for (const [i, a] of adapters.entries()) {
    daysAgo -= 4;
    await seedDocument(ctx, {
      kind: 'adapter',
      author: authors[i % authors.length],
      slug: slugify(a.title, 'adapter'),
      revisions: [
        {
          title: a.title,
          content: a.content as Record<string, unknown>,
          state: 'published',
          reviewer: mod,
          daysAgo,
          note: notes[i],
        },
      ],
    });
  }
  const draft = await draftWithMistakes(ctx);
  await seedDocument(ctx, {
    kind: 'adapter',
    author: users['member@example.test'],
    revisions: [
      {
        title: draft.title,
        content: draft.content as Record<string, unknown>,
        state: 'draft',
        daysAgo: 1,
      },
    ],
  });
}
