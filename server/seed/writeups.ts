/**
 * Demo write-ups in the invented scenario (the Brindlemoor 4.2 platform, the Quorvane T3
 * engine): a relocated sensor plug with a wire run, a pump plug with a parts list of
 * three build options, and a re-routed fan feed with torque values. Their images are
 * drawings the seed makes itself and stores through the uploads service, so they are
 * re-encoded and served like any member's photo.
 */
import type { AppContext } from '../context';
import type { Annotation } from '../../shared/schemas/annotations';
import type { WriteupContent } from '../../shared/schemas/writeup';
import { toSi } from '../../shared/writeup/units';
import { composeReturnNote } from '../../shared/writeup/imageNotes';
import { createUpload } from '../services/uploads';
import { DEMO_CONNECTOR_SLUGS } from './connectors';
import type { DemoUsers } from './demo';
import { seedDocument } from './documents';
import {
  DRAWING_HEIGHT,
  DRAWING_WIDTH,
  drawBracket,
  drawFanRoute,
  drawLoomWithSplices,
  drawSmallPlug,
  drawTenCavityPlug,
} from './writeupDrawings';

const GNYE: [string, string] = ['#2e9b45', '#f7d31e'];
const BNWH: [string, string] = ['#7a4b2a', '#f8f8f4'];
const BU: [string] = ['#2463c9'];
const RD: [string] = ['#d62828'];
const BK: [string] = ['#1b1b1b'];
const VTWH: [string, string] = ['#7b45b0', '#f8f8f4'];
const GY: [string] = ['#8e8e8e'];

type Shape = Annotation extends infer A ? (A extends Annotation ? Omit<A, 'id'> : never) : never;

function marks(prefix: string, list: Shape[]): Annotation[] {
  return list.map((a, i) => ({ ...a, id: `${prefix}${i + 1}` }) as Annotation);
}

async function stored(ctx: AppContext, ownerId: number, name: string, draw: () => Promise<Buffer>) {
  const upload = await createUpload(ctx, ownerId, { buffer: await draw(), originalname: name });
  return { uploadId: upload.publicId, width: upload.width, height: upload.height };
}

/** The demo step: three published write-ups, one of them returned once for an image. */
export async function seedWriteups(ctx: AppContext, users: DemoUsers) {
  const mod = users['moderator@example.test'];
  const sable = users['sable.wren@example.test'];
  const pell = users['pell.marrow@example.test'];
  const tobin = users['tobin.arkwell@example.test'];

  // Drawn and processed together: the image workers re-encode while the next is drawn.
  const [plug3, loom3, bracket, plug10, loomPump, fanRoute, fanPlug] = await Promise.all([
    stored(ctx, sable.id, 'coolant-plug-wire-side.png', () =>
      drawSmallPlug([GNYE, BNWH, BU], '3-cavity sensor plug, sealed'),
    ),
    stored(ctx, sable.id, 'coolant-loom-splices.png', () =>
      drawLoomWithSplices([GNYE, BNWH, BU], 'Loom at the thermostat housing'),
    ),
    stored(ctx, sable.id, 'coolant-bracket.png', drawBracket),
    stored(ctx, pell.id, 'pump-plug-mating-face.png', drawTenCavityPlug),
    stored(ctx, pell.id, 'pump-loom.png', () =>
      drawLoomWithSplices([BK, VTWH, GY], 'Loom under the rear seat'),
    ),
    stored(ctx, tobin.id, 'fan-feed-route.png', drawFanRoute),
    stored(ctx, tobin.id, 'fan-plug.png', () => drawSmallPlug([RD, BK], '2-cavity fan motor plug')),
  ]);
  // Positions are fractions of the drawing, whatever size the web copy is.
  const X = (px: number) => px / DRAWING_WIDTH;
  const Y = (px: number) => px / DRAWING_HEIGHT;

  const coolant: WriteupContent = {
    summary:
      'The Quorvane T3 coolant sensor plug moved 350 mm along the heater hose to a bracket, with all three wires lengthened by crimped and sealed splices.',
    body: `Once the taller intake is on, the coolant temperature sensor's plug on the Quorvane T3 sits out of reach under the runners. I moved the plug 350 mm along the heater hose to a bracket on the thermostat housing and lengthened its three wires.

[[sheet:${DEMO_CONNECTOR_SLUGS.coolantSensor}]]

:::caution battery
Disconnect the negative battery terminal before you unplug the sensor or cut into the loom, and keep the cable end away from the post.
:::

## 1. Note which wire goes where

![The plug from the wire side; markers 1 to 3 are cavities A to C](image:1)

Cavity A is the signal to the control module (GN/YE), B the shared low reference (BN/WH) and C the gauge sender (BU). Check your loom against the sheet before you cut anything: a swapped low reference reads as a cold engine.

## 2. Splice in the extension

1. Cut each wire 60 mm behind the plug, one at a time, so they cannot be mixed up.
2. Slide a length of heat-shrink over each cut end first.
3. Crimp a 350 mm piece of the same size and colour between the two ends, then shrink the sleeves.
4. Stagger the splices by 40 mm so the loom does not bulge in one place.

![Splices staggered along the loom, sleeves shrunk](image:2)

The wire run below lists every wire with its added length; the totals say how much wire and how many sleeves to buy.

## 3. Fix the plug to the bracket

:::caution heat Keep the loom clear of the heat shield
The bracket sits near the exhaust heat shield. Keep the loom at least 50 mm away from it and tie it every 150 mm so it cannot sag onto it.
:::

![The plug clipped to the bracket, clear of the heat shield](image:3)

Start the engine and compare the gauge with a probe thermometer on the housing once it is warm: both should agree within a few degrees.`,
    images: [
      {
        ...plug3,
        caption: 'The 3-cavity plug from the wire side, cavities A to C',
        annotations: marks('p', [
          {
            type: 'marker',
            x: X(420),
            y: Y(365),
            text: 'A: signal to the control module, GN/YE',
            color: 'signal-yellow',
          },
          {
            type: 'marker',
            x: X(600),
            y: Y(365),
            text: 'B: low reference, BN/WH',
            color: 'signal-yellow',
          },
          {
            type: 'marker',
            x: X(780),
            y: Y(365),
            text: 'C: gauge sender, BU',
            color: 'signal-yellow',
          },
          { type: 'label', x: X(700), y: Y(190), text: 'Latch faces up', color: 'copper' },
        ]),
      },
      {
        ...loom3,
        caption: 'The added pieces between two rows of splices',
        annotations: marks('l', [
          {
            type: 'box',
            x: X(730),
            y: Y(230),
            x2: X(870),
            y2: Y(400),
            text: 'Splices at the loom end',
            color: 'coolant-cyan',
          },
          {
            type: 'box',
            x: X(970),
            y: Y(185),
            x2: X(1110),
            y2: Y(350),
            text: 'Splices at the plug end',
            color: 'coolant-cyan',
          },
          {
            type: 'arrow',
            x: X(470),
            y: Y(620),
            x2: X(560),
            y2: Y(430),
            text: 'Tape over the conduit end',
            color: 'copper',
          },
        ]),
      },
      {
        ...bracket,
        caption: 'The plug on its bracket, 50 mm from the heat shield',
        annotations: marks('b', [
          {
            type: 'marker',
            x: X(600),
            y: Y(140),
            text: 'Cable tie, every 150 mm along the loom',
            color: 'copper',
          },
          {
            type: 'arrow',
            x: X(180),
            y: Y(650),
            x2: X(310),
            y2: Y(540),
            text: 'Bracket bolts',
            color: 'signal-yellow',
          },
          {
            type: 'box',
            x: X(880),
            y: Y(90),
            x2: X(1190),
            y2: Y(700),
            text: 'Heat shield: keep 50 mm clear',
            color: 'fuse-magenta',
          },
        ]),
      },
    ],
    wireRun: {
      systemVoltage: 12,
      wires: [
        {
          color: 'GN/YE',
          size: '0.5 mm²',
          role: 'signal',
          from: 'Sensor plug, old position under the runners',
          to: 'Bracket on the thermostat housing',
          addedLengthMm: 350,
          join: 'crimped-splice',
          currentA: 0.005,
        },
        {
          color: 'BN/WH',
          size: '0.5 mm²',
          role: 'low reference',
          from: 'Sensor plug, old position under the runners',
          to: 'Bracket on the thermostat housing',
          addedLengthMm: 350,
          join: 'crimped-splice',
          currentA: 0.01,
        },
        {
          color: 'BU',
          size: '0.5 mm²',
          role: 'signal',
          from: 'Sensor plug, old position under the runners',
          to: 'Bracket on the thermostat housing',
          addedLengthMm: 350,
          join: 'soldered-sealed-splice',
          currentA: 0.02,
          note: 'Gauge sender',
        },
      ],
    },
  };

  const pump: WriteupContent = {
    summary:
      'Three ways to reach the Brindlemoor 4.2 pump module plug after moving the pump forward, with a parts list per option.',
    body: `Moving the Brindlemoor 4.2 fuel pump module forward in the tank carrier leaves its 10-cavity plug 400 mm short of the body loom. There are three ways to bridge it; the parts list compares them.

[[sheet:${DEMO_CONNECTOR_SLUGS.pumpModule}]]

:::caution fuel
Relieve the fuel pressure the way the service information describes before you unplug the pump module, and work with the tank vent open, away from sparks.
:::

## The options

- **Splice in the loom:** cut the body loom and splice 400 mm of wire into each of the five used circuits. Cheapest, but the splices sit under the seat where they are hard to inspect.
- **Pigtail extension:** a short pigtail with a mating plug on each end. No cutting; one more pair of contacts per circuit.
- **New sub-harness:** a new run from the body plug to the pump with its own grommet. Most work, best result.

![The plug from the mating face: the five cavities in use are marked](image:1)

![Where the body loom ends today, under the rear seat](image:2)

I built the pigtail. The totals below are my own estimates from what I paid; check current prices.`,
    images: [
      {
        ...plug10,
        caption: 'The 10-cavity pump module plug from the mating face',
        annotations: marks('m', [
          {
            type: 'marker',
            x: X(320),
            y: Y(320),
            text: 'Cavity 1: pump motor +',
            color: 'fuse-magenta',
          },
          {
            type: 'marker',
            x: X(460),
            y: Y(320),
            text: 'Cavity 2: pump motor −',
            color: 'fuse-magenta',
          },
          {
            type: 'marker',
            x: X(320),
            y: Y(450),
            text: 'Cavity 6: level sender signal',
            color: 'coolant-cyan',
          },
          {
            type: 'marker',
            x: X(460),
            y: Y(450),
            text: 'Cavity 7: sender low reference',
            color: 'coolant-cyan',
          },
          {
            type: 'marker',
            x: X(600),
            y: Y(450),
            text: 'Cavity 8: tank pressure signal',
            color: 'coolant-cyan',
          },
          { type: 'label', x: X(700), y: Y(120), text: 'Lock', color: 'copper' },
        ]),
      },
      {
        ...loomPump,
        caption: 'The body loom where it ends today',
        annotations: marks('r', [
          {
            type: 'arrow',
            x: X(200),
            y: Y(700),
            x2: X(560),
            y2: Y(420),
            text: 'Body loom, 400 mm short',
            color: 'signal-yellow',
          },
          {
            type: 'box',
            x: X(730),
            y: Y(230),
            x2: X(1120),
            y2: Y(480),
            text: 'Where the extension joins',
            color: 'earth-green',
          },
        ]),
      },
    ],
    parts: {
      currency: 'EUR',
      options: [
        { id: 'splice', name: 'Splice in the loom' },
        { id: 'pigtail', name: 'Pigtail extension' },
        { id: 'harness', name: 'New sub-harness' },
      ],
      items: [
        {
          name: 'Wire, 1.5 mm², 5 m (pump feed and return)',
          quantity: 1,
          priceLow: 4,
          priceHigh: 6,
          options: ['splice', 'pigtail', 'harness'],
        },
        {
          name: 'Wire, 0.5 mm², 5 m (sender circuits)',
          quantity: 1,
          priceLow: 3,
          priceHigh: 4.5,
          options: ['splice', 'pigtail', 'harness'],
        },
        {
          name: 'Heat-shrink crimp splices',
          quantity: 10,
          priceLow: 0.3,
          priceHigh: 0.5,
          options: ['splice'],
        },
        {
          name: '10-cavity plug and mating header, with terminals and seals',
          quantity: 1,
          priceLow: 18,
          priceHigh: 26,
          options: ['pigtail', 'harness'],
        },
        {
          name: 'Cavity plugs for the unused cavities',
          quantity: 5,
          priceLow: 0.2,
          priceHigh: 0.3,
          options: ['pigtail', 'harness'],
        },
        {
          name: 'Convoluted conduit, 1 m',
          quantity: 1,
          priceLow: 2,
          priceHigh: 3,
          options: ['pigtail', 'harness'],
        },
        { name: 'Floor grommet', quantity: 1, priceLow: 3, priceHigh: 5, options: ['harness'] },
        {
          name: 'Body-side plug for the new run',
          quantity: 1,
          priceLow: 14,
          priceHigh: 20,
          options: ['harness'],
        },
      ],
    },
  };

  const fanV1: WriteupContent = {
    summary:
      'The Brindlemoor 4.2 cooling fan feed re-routed along the top rail, away from the exhaust manifold, with its ground stud and fuse holder torques.',
    body: `The fan feed on the Brindlemoor 4.2 runs below the exhaust manifold, and mine had a cracked jacket after a hot summer. I moved it up to the top rail, where the new route is 180 mm longer and nowhere near the heat.

[[sheet:${DEMO_CONNECTOR_SLUGS.coolingFan}]]

:::caution high-current
The fan draws about 25 A at start. Keep the fuse close to the supply, sized for the wire, and use terminals rated for the current.
:::

:::caution heat
Route the new run at least 50 mm from the manifold and clip it every 200 mm so it cannot drop onto it.
:::

![The old route past the manifold and the new one along the rail](image:1)

![The 2-cavity fan motor plug from the wire side](image:2)

Tighten the ground stud and the fuse holder stud in two passes; the values below are in your units.`,
    images: [
      {
        ...fanRoute,
        caption: 'Old route (dashed) and new route along the top rail',
        annotations: marks('f', [
          {
            type: 'box',
            x: X(500),
            y: Y(440),
            x2: X(760),
            y2: Y(500),
            text: 'Old route, 40 mm from the manifold',
            color: 'fuse-magenta',
          },
          {
            type: 'arrow',
            x: X(200),
            y: Y(250),
            x2: X(200),
            y2: Y(110),
            text: 'Clips every 200 mm',
            color: 'signal-yellow',
          },
          {
            type: 'marker',
            x: X(380),
            y: Y(75),
            text: 'Second clip, on the rail stud',
            color: 'signal-yellow',
          },
        ]),
      },
      {
        ...fanPlug,
        caption: 'The fan motor plug from the wire side',
        annotations: marks('q', [
          { type: 'marker', x: X(510), y: Y(365), text: 'A: motor +, RD', color: 'fuse-magenta' },
          { type: 'marker', x: X(690), y: Y(365), text: 'B: motor −, BK', color: 'chalk-white' },
        ]),
      },
    ],
    specs: [
      {
        label: 'Ground stud nut, first pass',
        quantity: 'torque',
        value: toSi('torque', 44, 'imperial'),
      },
      {
        label: 'Ground stud nut, final pass',
        quantity: 'torque',
        value: toSi('torque', 89, 'imperial'),
      },
      { label: 'Fuse holder stud', quantity: 'torque', value: 5 },
      { label: 'Clearance from the manifold, at least', quantity: 'length', value: 50 },
      { label: 'Added length of the new route', quantity: 'length', value: 180 },
    ],
  };
  // The first revision was sent back because its first photo showed a readable plate.
  const fanV0: WriteupContent = { ...fanV1, images: fanV1.images.map((img) => ({ ...img })) };

  await seedDocument(ctx, {
    kind: 'writeup',
    author: sable,
    revisions: [
      {
        title: 'Moving the Quorvane T3 coolant sensor plug onto a bracket',
        content: coolant,
        state: 'published',
        daysAgo: 12,
        reviewer: mod,
        note: 'Clear steps and good markings. Published.',
      },
    ],
  });
  await seedDocument(ctx, {
    kind: 'writeup',
    author: pell,
    revisions: [
      {
        title: 'Brindlemoor 4.2 pump module plug: three ways to reach the moved pump',
        content: pump,
        state: 'published',
        daysAgo: 8,
        reviewer: mod,
      },
    ],
  });
  await seedDocument(ctx, {
    kind: 'writeup',
    author: tobin,
    revisions: [
      {
        title: 'Re-routing the Brindlemoor 4.2 cooling fan feed away from the exhaust',
        content: fanV0,
        state: 'returned',
        daysAgo: 6,
        reviewer: mod,
        note: composeReturnNote(
          'Thanks, this is useful. One image needs a change before it can go out.',
          [
            {
              image: 1,
              note: 'A number plate is readable at the top left: crop it or draw over it.',
            },
          ],
        ),
      },
      {
        title: 'Re-routing the Brindlemoor 4.2 cooling fan feed away from the exhaust',
        content: fanV1,
        state: 'published',
        daysAgo: 4,
        reviewer: mod,
      },
    ],
  });
}
