/**
 * Demo connector sheets of an invented scenario: the Brindlemoor 4.2 and Brindlemoor 3.6 vehicle
 * platforms (body wiring in AWG) and the Quorvane T3 engine (engine harness in mm²).
 * Nothing here names a real make, model, brand, part number or person.
 */
import type { AppContext } from '../context';
import type { ConnectorContent, PinRow } from '../../shared/schemas/connector';
import { slugify } from '../services/documents';
import type { DemoUsers } from './demo';
import { seedDocument } from './documents';

type Pin = [
  cavity: string,
  role: string,
  color: string,
  size: string,
  circuit?: string,
  note?: string,
];

const pins = (rows: Pin[]): PinRow[] =>
  rows.map(([cavity, role, color, size, circuit = '', note = '']) => ({
    cavity,
    role,
    color,
    size,
    circuit,
    note,
  }));

const BRINDLEMOOR_42 = ['Brindlemoor 4.2 platform'];
const QUORVANE_T3 = ['Quorvane T3 engine'];

/** The published sheets, by a key the other demo steps use. */
const SHEETS = {
  coolantSensor: {
    title: 'Quorvane T3 coolant temperature sensor, 3-cavity',
    content: {
      cavities: ['A', 'B', 'C'],
      labels: 'alpha',
      layout: { rows: 1, cols: 3 },
      housing: 'socket',
      view: 'wire-side',
      sealed: true,
      component: 'coolant temperature sensor',
      tags: [...QUORVANE_T3, 'thermostat housing'],
      terminalSize: '1.5 mm blade',
      wireSize: { min: '0.35 mm²', max: '0.75 mm²' },
      pins: pins([
        [
          'A',
          'signal',
          'GN/YE',
          '0.5 mm²',
          'T31',
          'Engine coolant temperature to the control module',
        ],
        [
          'B',
          'low reference',
          'BN/WH',
          '0.5 mm²',
          'T32',
          'Shared with the intake air temperature sensor',
        ],
        ['C', 'signal', 'BU', '0.5 mm²', 'T35', 'Gauge sender to the instrument cluster'],
      ]),
      summary: 'Dual-element sensor: one element for the control module, one for the gauge.',
    },
  },
  injector: {
    title: 'Quorvane T3 fuel injector, 2-cavity',
    content: {
      cavityCount: 2,
      labels: 'numeric',
      layout: { rows: 1, cols: 2 },
      housing: 'socket',
      view: 'mating-face',
      sealed: true,
      component: 'fuel injector',
      tags: [...QUORVANE_T3, 'port injection'],
      terminalSize: '2.8 mm blade',
      wireSize: { min: '0.5 mm²', max: '1 mm²' },
      pins: pins([
        [
          '1',
          'switched ignition feed',
          'RD/WH',
          '0.75 mm²',
          'F12',
          'Fused injector supply, common to all four injectors',
        ],
        [
          '2',
          'injector control (low side)',
          'BU/BK',
          '0.75 mm²',
          'J1',
          'Cylinder 1; cylinders 2–4 use BU/RD, BU/YE, BU/GN',
        ],
      ]),
    },
  },
  pedalSensor: {
    title: 'Brindlemoor 4.2 accelerator pedal position sensor, 6-cavity',
    content: {
      cavityCount: 6,
      labels: 'numeric',
      layout: { rows: 2, cols: 3 },
      housing: 'socket',
      view: 'wire-side',
      sealed: false,
      component: 'accelerator pedal position sensor',
      tags: [...BRINDLEMOOR_42, 'drive-by-wire'],
      terminalSize: '0.64 mm',
      wireSize: { min: '24 AWG', max: '20 AWG' },
      pins: pins([
        ['1', '5 V reference', 'GY', '22 AWG', 'P11', 'Track 1 supply'],
        ['2', 'signal', 'GN', '22 AWG', 'P12', 'Track 1, rises with pedal travel'],
        ['3', 'low reference', 'BK/BU', '22 AWG', 'P13', 'Track 1'],
        [
          '4',
          '5 V reference',
          'GY/WH',
          '22 AWG',
          'P21',
          'Track 2 supply, from a separate regulator',
        ],
        ['5', 'signal', 'BU/YE', '22 AWG', 'P22', 'Track 2, half the voltage of track 1'],
        ['6', 'low reference', 'BK/YE', '22 AWG', 'P23', 'Track 2'],
      ]),
    },
  },
  pumpModule: {
    title: 'Brindlemoor 4.2 fuel pump module plug, 10-cavity',
    content: {
      cavityCount: 10,
      labels: 'numeric',
      layout: { rows: 2, cols: 5 },
      housing: 'socket',
      view: 'mating-face',
      sealed: true,
      component: 'fuel pump module',
      tags: [...BRINDLEMOOR_42, 'fuel tank'],
      terminalSize: '1.5 mm blade (1–2), 0.64 mm (3–10)',
      wireSize: { min: '22 AWG', max: '14 AWG' },
      pins: pins([
        ['1', 'motor +', 'GY', '14 AWG', '120', 'From the fuel pump relay, 15 A fuse'],
        ['2', 'motor −', 'BK', '14 AWG', '1050', 'To the body ground stud behind the rear seat'],
        ['3', 'signal', 'VT/WH', '20 AWG', '30', 'Fuel level sender'],
        ['4', 'low reference', 'BK/VT', '20 AWG', '31', 'Fuel level sender'],
        ['5', '5 V reference', 'GY/BU', '20 AWG', '41', 'Tank pressure sensor'],
        ['6', 'signal', 'GN/WH', '20 AWG', '42', 'Tank pressure sensor'],
        ['7', 'low reference', 'BK/GN', '20 AWG', '43', 'Tank pressure sensor'],
        ['8', 'unused', '', '', '', 'Cavity plug fitted'],
        ['9', 'unused', '', '', '', 'Cavity plug fitted'],
        [
          '10',
          'shield',
          'BK',
          '22 AWG',
          '',
          'Drain of the pressure sensor pair, grounded at the module end only',
        ],
      ]),
    },
  },
  oxygenSensor: {
    title: 'Quorvane T3 upstream oxygen sensor, 4-cavity',
    content: {
      cavities: ['A', 'B', 'C', 'D'],
      labels: 'custom',
      // The housing numbers its cavities round the square, not row by row.
      layout: {
        rows: 2,
        cols: 2,
        positions: [
          { label: 'A', row: 0, col: 0 },
          { label: 'B', row: 0, col: 1 },
          { label: 'C', row: 1, col: 1 },
          { label: 'D', row: 1, col: 0 },
        ],
      },
      housing: 'pin',
      view: 'mating-face',
      sealed: true,
      component: 'oxygen sensor (upstream, heated)',
      tags: [...QUORVANE_T3, 'exhaust'],
      terminalSize: '1.5 mm blade',
      wireSize: { min: '0.35 mm²', max: '1 mm²' },
      pins: pins([
        ['A', 'switched ignition feed', 'RD/BU', '0.75 mm²', 'H1', 'Heater supply, 10 A fuse'],
        [
          'B',
          'heater control (low side)',
          'WH/BK',
          '0.75 mm²',
          'H2',
          'Switched by the control module',
        ],
        ['C', 'signal', 'GY', '0.5 mm²', 'O1', 'Sensor output'],
        ['D', 'low reference', 'BN', '0.5 mm²', 'O2', 'Sensor low reference, not chassis ground'],
      ]),
      notes:
        'The pigtail runs next to the exhaust downpipe: keep any extension on the original heat-shielded route.',
    },
  },
  bodyHarness8: {
    title: 'Brindlemoor 4.2 rear body harness plug, 8-way',
    content: {
      cavityCount: 8,
      labels: 'numeric',
      layout: { rows: 2, cols: 4 },
      housing: 'socket',
      view: 'wire-side',
      sealed: false,
      component: 'body harness (fuel pump branch, under the rear seat)',
      tags: [...BRINDLEMOOR_42, 'body harness'],
      terminalSize: '1.5 mm blade (1–2), 0.64 mm (3–8)',
      wireSize: { min: '22 AWG', max: '14 AWG' },
      pins: pins([
        ['1', 'motor +', 'GY', '14 AWG', '120', 'Fuel pump feed'],
        ['2', 'ground', 'BK', '14 AWG', '1050'],
        ['3', 'signal', 'VT/WH', '20 AWG', '30', 'Fuel level'],
        ['4', 'low reference', 'BK/VT', '20 AWG', '31'],
        ['5', '5 V reference', 'GY/BU', '20 AWG', '41', 'Tank pressure'],
        ['6', 'signal', 'GN/WH', '20 AWG', '42', 'Tank pressure'],
        ['7', 'low reference', 'BK/GN', '20 AWG', '43', 'Tank pressure'],
        ['8', 'unused', '', '', ''],
      ]),
    },
  },
  bodyHarness6: {
    title: 'Brindlemoor 3.6 rear body harness plug, 6-way',
    content: {
      cavityCount: 6,
      labels: 'numeric',
      layout: { rows: 2, cols: 3 },
      housing: 'socket',
      view: 'wire-side',
      sealed: false,
      component: 'body harness (fuel pump branch, under the rear seat)',
      tags: ['Brindlemoor 3.6 platform', 'body harness'],
      terminalSize: '1.5 mm blade (1–2), 0.64 mm (3–6)',
      wireSize: { min: '22 AWG', max: '14 AWG' },
      pins: pins([
        ['1', 'motor +', 'GY', '14 AWG', '120', 'Fuel pump feed'],
        ['2', 'ground', 'BK', '14 AWG', '1050'],
        ['3', 'signal', 'VT/WH', '20 AWG', '30', 'Fuel level'],
        ['4', 'low reference', 'BK/VT', '20 AWG', '31'],
        ['5', 'unused', '', '', '', 'The 3.6 platform has no tank pressure sensor'],
        ['6', 'unused', '', '', ''],
      ]),
    },
  },
  controlModule12: {
    title: 'Quorvane T3 engine control module plug C2, 12-way',
    content: {
      cavityCount: 12,
      labels: 'numeric',
      layout: { rows: 2, cols: 6 },
      housing: 'socket',
      view: 'wire-side',
      sealed: true,
      component: 'engine control module',
      tags: [...QUORVANE_T3, 'control module'],
      terminalSize: '0.64 mm (5–12), 1.5 mm blade (1–4)',
      wireSize: { min: '0.35 mm²', max: '1.5 mm²' },
      pins: pins([
        ['1', 'battery feed', 'RD', '1 mm²', 'B30', 'Keep-alive memory, 10 A fuse at the battery'],
        ['2', 'switched ignition feed', 'RD/GN', '0.75 mm²', 'I15'],
        ['3', 'ground', 'BK', '1.5 mm²', 'G1', 'Engine block stud'],
        ['4', 'ground', 'BK/WH', '1.5 mm²', 'G2', 'Engine block stud'],
        ['5', 'serial data high', 'WH/BU', '0.5 mm²', 'D+', 'Twisted with cavity 6'],
        ['6', 'serial data low', 'WH/GN', '0.5 mm²', 'D−', 'Twisted with cavity 5'],
        ['7', '5 V reference', 'GY', '0.5 mm²', 'S5', 'Manifold pressure and camshaft sensors'],
        ['8', 'low reference', 'BN/WH', '0.5 mm²', 'S0', 'Sensor low reference'],
        ['9', 'signal', 'GN/VT', '0.5 mm²', 'M1', 'Manifold absolute pressure'],
        ['10', 'signal', 'YE/BU', '0.5 mm²', 'C1', 'Camshaft position'],
        ['11', 'injector control (low side)', 'BU/BK', '0.75 mm²', 'J1', 'Cylinder 1'],
        ['12', 'relay control (low side)', 'VT', '0.5 mm²', 'R1', 'Main relay coil'],
      ]),
    },
  },
  mapSensor: {
    title: 'Quorvane T3 manifold absolute pressure sensor, 3-cavity',
    content: {
      cavityCount: 3,
      labels: 'numeric',
      layout: { rows: 1, cols: 3 },
      housing: 'socket',
      view: 'mating-face',
      sealed: true,
      component: 'manifold absolute pressure sensor',
      tags: [...QUORVANE_T3, 'intake manifold'],
      terminalSize: '0.64 mm',
      wireSize: { min: '0.35 mm²', max: '0.75 mm²' },
      pins: pins([
        ['1', '5 V reference', 'GY', '0.5 mm²', 'S5'],
        ['2', 'low reference', 'BN/WH', '0.5 mm²', 'S0'],
        ['3', 'signal', 'GN/VT', '0.5 mm²', 'M1', 'About 1 V at idle, 4.5 V at full load'],
      ]),
    },
  },
  camSensor: {
    title: 'Quorvane T3 camshaft position sensor, 3-cavity',
    content: {
      cavities: ['A', 'B', 'C'],
      labels: 'alpha',
      layout: { rows: 1, cols: 3 },
      housing: 'socket',
      view: 'wire-side',
      sealed: true,
      component: 'camshaft position sensor (Hall effect)',
      tags: [...QUORVANE_T3, 'cylinder head'],
      terminalSize: '0.64 mm',
      wireSize: { min: '0.35 mm²', max: '0.75 mm²' },
      pins: pins([
        ['A', '5 V reference', 'GY', '0.5 mm²', 'S5'],
        ['B', 'signal', 'YE/BU', '0.5 mm²', 'C1', 'Square wave, one pulse per camshaft turn'],
        ['C', 'low reference', 'BN/WH', '0.5 mm²', 'S0'],
      ]),
    },
  },
  throttleBody: {
    title: 'Quorvane T3 electronic throttle body, 6-cavity',
    content: {
      cavityCount: 6,
      labels: 'numeric',
      layout: { rows: 2, cols: 3 },
      housing: 'socket',
      view: 'mating-face',
      sealed: true,
      component: 'electronic throttle body',
      tags: [...QUORVANE_T3, 'drive-by-wire'],
      terminalSize: '0.64 mm',
      wireSize: { min: '0.35 mm²', max: '0.75 mm²' },
      pins: pins([
        [
          '1',
          'motor +',
          'VT/WH',
          '0.75 mm²',
          'TM+',
          'Throttle motor, driven by an H-bridge in the module',
        ],
        ['2', 'motor −', 'VT/BK', '0.75 mm²', 'TM−'],
        ['3', '5 V reference', 'GY/RD', '0.5 mm²', 'TP5'],
        ['4', 'signal', 'GN', '0.5 mm²', 'TP1', 'Position 1'],
        ['5', 'low reference', 'BN/WH', '0.5 mm²', 'TP0'],
        ['6', 'signal', 'GN/BU', '0.5 mm²', 'TP2', 'Position 2, falls as position 1 rises'],
      ]),
    },
  },
  coolingFan: {
    title: 'Brindlemoor 4.2 radiator cooling fan plug, 2-cavity',
    content: {
      cavities: ['A', 'B'],
      labels: 'alpha',
      layout: { rows: 1, cols: 2 },
      housing: 'socket',
      view: 'mating-face',
      sealed: true,
      component: 'radiator cooling fan motor',
      tags: [...BRINDLEMOOR_42, 'cooling'],
      terminalSize: '6.3 mm blade',
      wireSize: { min: '12 AWG', max: '10 AWG' },
      pins: pins([
        ['A', 'motor +', 'RD', '10 AWG', '210', 'From the fan relay, 40 A fuse'],
        ['B', 'ground', 'BK', '10 AWG', '1010', 'Front ground stud, left headlamp'],
      ]),
    },
  },
} satisfies Record<string, { title: string; content: ConnectorContent }>;

export type DemoConnectorKey = keyof typeof SHEETS;

/** The slug of each published demo sheet, so other demo steps can link them. */
export const DEMO_CONNECTOR_SLUGS = Object.fromEntries(
  Object.entries(SHEETS).map(([key, s]) => [key, slugify(s.title, 'connector')]),
) as Record<DemoConnectorKey, string>;

/** A published demo sheet by its key: id, slug, title and content, for linking from an adapter. */
export async function demoConnector(ctx: AppContext, key: DemoConnectorKey) {
  const doc = await ctx.models.Document.findOne({ where: { slug: DEMO_CONNECTOR_SLUGS[key] } });
  if (!doc?.publishedRevisionId) throw new Error(`the demo connector "${key}" has not been seeded`);
  const rev = (await ctx.models.Revision.findByPk(doc.publishedRevisionId))!;
  return { id: doc.id, slug: doc.slug, title: rev.title, content: rev.content as ConnectorContent };
}

/** The demo step: a dozen published sheets, two submissions waiting, one returned to member@. */
export async function seedConnectors(ctx: AppContext, users: DemoUsers) {
  const mod = users['moderator@example.test'];
  const rook = users['member@example.test'];
  const juniper = users['member2@example.test'];
  const sable = users['sable.wren@example.test'];
  const tobin = users['tobin.arkwell@example.test'];
  const pell = users['pell.marrow@example.test'];

  const authors: Record<DemoConnectorKey, typeof rook> = {
    coolantSensor: sable,
    injector: tobin,
    pedalSensor: rook,
    pumpModule: pell,
    oxygenSensor: tobin,
    bodyHarness8: pell,
    bodyHarness6: pell,
    controlModule12: sable,
    mapSensor: juniper,
    camSensor: juniper,
    throttleBody: tobin,
    coolingFan: rook,
  };

  let daysAgo = 40;
  for (const [key, sheet] of Object.entries(SHEETS) as Array<
    [DemoConnectorKey, (typeof SHEETS)[DemoConnectorKey]]
  >) {
    daysAgo -= 3;
    const published = {
      title: sheet.title,
      content: sheet.content,
      state: 'published' as const,
      reviewer: mod,
    };
    if (key === 'coolantSensor') {
      // Published, and its next revision waits in the queue while the first stays visible.
      await seedDocument(ctx, {
        kind: 'connector',
        author: authors[key],
        slug: DEMO_CONNECTOR_SLUGS[key],
        revisions: [
          {
            ...published,
            daysAgo: daysAgo + 10,
            note: 'Checked against a probed harness. Thanks for the gauge circuit.',
          },
          {
            title: sheet.title,
            content: {
              ...sheet.content,
              pins: sheet.content.pins.map((p) =>
                p.cavity === 'C'
                  ? {
                      ...p,
                      color: 'BU/YE',
                      note: 'Gauge sender; later builds use BU/YE instead of BU',
                    }
                  : p,
              ),
              notes: 'Builds from the second production year changed the gauge wire colour.',
            },
            state: 'submitted',
            daysAgo: 2,
          },
        ],
      });
      continue;
    }
    await seedDocument(ctx, {
      kind: 'connector',
      author: authors[key],
      slug: DEMO_CONNECTOR_SLUGS[key],
      revisions: [{ ...published, daysAgo }],
    });
  }

  await seedDocument(ctx, {
    kind: 'connector',
    author: juniper,
    revisions: [
      {
        title: 'Quorvane T3 knock sensor, 2-cavity',
        state: 'submitted',
        daysAgo: 1,
        content: {
          cavityCount: 2,
          labels: 'numeric',
          layout: { rows: 1, cols: 2 },
          housing: 'socket',
          view: 'mating-face',
          sealed: true,
          component: 'knock sensor',
          tags: [...QUORVANE_T3, 'engine block'],
          terminalSize: '1.5 mm blade',
          wireSize: { min: '0.35 mm²', max: '0.75 mm²' },
          pins: pins([
            ['1', 'signal', 'GN/BK', '0.5 mm²', 'K1', 'Shielded pair with cavity 2'],
            [
              '2',
              'low reference',
              'BN',
              '0.5 mm²',
              'K0',
              'The shield drains at the control module only',
            ],
          ]),
        } satisfies ConnectorContent,
      },
    ],
  });

  await seedDocument(ctx, {
    kind: 'connector',
    author: rook,
    revisions: [
      {
        title: 'Brindlemoor 4.2 steering column clock spring plug, 6-way',
        state: 'returned',
        daysAgo: 5,
        reviewer: mod,
        note: 'Say which side the drawing is viewed from, and add a note on cavities 5 and 6: they are the airbag squib loop and must never be probed. Resubmit when that is in.',
        content: {
          cavityCount: 6,
          labels: 'numeric',
          layout: { rows: 2, cols: 3 },
          housing: 'socket',
          view: '',
          sealed: false,
          component: 'steering column clock spring',
          tags: [...BRINDLEMOOR_42, 'steering column'],
          terminalSize: '0.64 mm',
          wireSize: { min: '22 AWG', max: '20 AWG' },
          pins: pins([
            ['1', 'signal', 'YE/GN', '22 AWG', 'H1', 'Horn switch'],
            ['2', 'signal', 'BU/WH', '22 AWG', 'W1', 'Wheel switches (resistor ladder)'],
            ['3', 'low reference', 'BK/WH', '22 AWG', 'W0'],
            ['4', 'unused', '', '', ''],
            ['5', 'airbag squib loop high', 'YE', '20 AWG', 'A+'],
            ['6', 'airbag squib loop low', 'YE/BK', '20 AWG', 'A−'],
          ]),
        } satisfies ConnectorContent,
      },
    ],
  });
}
