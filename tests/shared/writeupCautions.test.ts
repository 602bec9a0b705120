import { describe, expect, it } from 'vitest';
import { emptyWire } from '@shared/schemas/writeup';
import { cautionFindings, cautionMentions } from '@shared/writeup/cautions';
import { writeupFindings } from '@shared/writeup/findings';

const kinds = (body: string, extra: Parameters<typeof cautionFindings>[0] = {}) =>
  cautionFindings({ body, ...extra }).map((f) => f.kind);

describe('the caution check', () => {
  it.each([
    ['Unplug the fuel pump before you cut anything.', 'fuel'],
    ['The injector plug sits under the rail.', 'fuel'],
    ['Keep away from the airbag connector in the column.', 'airbag'],
    ['The SRS loom is yellow.', 'airbag'],
    ['Do not disturb the clock spring.', 'airbag'],
    ['Take the battery feed from the stud.', 'battery'],
    ['Run a new B+ wire to the relay.', 'battery'],
    ['This circuit is permanently live.', 'battery'],
    ['The fan draws 25 A at start.', 'high-current'],
    ['Use a 40A maxi fuse.', 'high-current'],
    ['A high-current feed for the compressor.', 'high-current'],
    ['Glow plug relay wiring.', 'high-current'],
  ])('asks for a caution when the text says "%s"', (body, kind) => {
    expect(kinds(body)).toEqual([kind]);
  });

  it.each([
    'Move the coolant temperature sensor 35 cm along the hose.',
    'The sensor draws 10 mA; a 5 A fuse is plenty.',
    'Disconnect the battery before you start.',
    'Use 20 a-grade terminals.',
  ])('asks for nothing when the text says "%s"', (body) => {
    expect(kinds(body)).toEqual([]);
  });

  it('is satisfied by a caution block of the same kind, and only that kind', () => {
    const body =
      'Relocate the fuel pump relay and its battery feed.\n\n:::caution fuel\nRelieve pressure first.\n:::\n';
    const f = cautionFindings({ body });
    expect(f.map((x) => x.kind)).toEqual(['battery']);
    expect(f[0]).toMatchObject({
      code: 'CAUTION_MISSING',
      severity: 'warning',
      field: 'body',
      line: 1,
    });
    expect(f[0].message).toContain('":::caution battery"');
    expect(f[0].message).toContain('"battery feed"');
    expect(kinds(body + '\n:::caution battery\nDisconnect it.\n:::\n')).toEqual([]);
  });

  it('does not count what a caution block itself says', () => {
    const body =
      ':::caution fuel\nDisconnect the battery terminal, then relieve the rail.\n:::\n\nThen move the sensor.';
    expect(kinds(body)).toEqual([]);
  });

  it('reads srs and other aliases as the airbag kind', () => {
    expect(kinds('Near the airbag module.\n\n:::caution srs\nWait ten minutes.\n:::')).toEqual([]);
  });

  it('ignores code blocks and names the line of the first mention', () => {
    expect(kinds('```\nfuel pump\n```\n')).toEqual([]);
    const f = cautionFindings({
      body: '# Steps\n\nOne.\n\nTwo: the fuel line.\n\nThree: fuel again.',
    });
    expect(f).toHaveLength(1);
    expect(f[0].line).toBe(5);
    expect(f[0].message).toMatch(/^Line 5 of the text mentions the fuel system/);
  });

  it('reads the wire run too: roles and currents', () => {
    const wireRun = {
      wires: [
        { ...emptyWire(), role: 'battery feed', currentA: 2 },
        { ...emptyWire(), role: 'motor +', currentA: 20 },
      ],
    };
    const m = cautionMentions({ body: 'Moving the relay.', wireRun });
    expect(m.map((x) => [x.kind, x.where, x.match])).toEqual([
      ['battery', 'wireRun', 'battery feed'],
      ['high-current', 'wireRun', '20 A'],
    ]);
    expect(cautionFindings({ body: '', wireRun })[0].message).toMatch(
      /^The wire run mentions a battery feed/,
    );
  });
});

describe('writeupFindings', () => {
  it('reports the caution check, image references beyond the images, and blank text', () => {
    const f = writeupFindings({
      body: 'Cut the fuel pump feed.\n\n![the pump](image:2)\n',
      images: [{ uploadId: '00000000-0000-4000-8000-000000000001', caption: '', annotations: [] }],
    });
    expect(f.ok).toBe(false);
    expect(f.errors.map((e) => e.code)).toEqual(['IMAGE_REF_UNKNOWN']);
    expect(f.errors[0].message).toContain('places image 2, but the write-up has one image');
    expect(f.warnings.map((w) => w.code)).toEqual(['CAUTION_MISSING', 'IMAGE_NO_CAPTION']);
    expect(f.cautions).toEqual(['fuel']);
    expect(writeupFindings({ body: '  ' }).errors.map((e) => e.code)).toEqual(['BODY_EMPTY']);
  });

  it('reports wire sizes and colours it cannot read, and a large added drop', () => {
    const f = writeupFindings({
      body: 'Steps.',
      wireRun: {
        wires: [
          { ...emptyWire(), size: '0.5 mm²', color: 'XX', from: 'a', to: 'b', addedLengthMm: 100 },
          { ...emptyWire(), size: '', color: 'RD', from: 'a', to: '', addedLengthMm: 100 },
          {
            ...emptyWire(),
            size: '24 AWG',
            color: 'RD',
            from: 'a',
            to: 'b',
            addedLengthMm: 4000,
            currentA: 2,
          },
        ],
      },
    });
    expect(f.warnings.map((w) => [w.code, w.row])).toEqual([
      ['WIRE_COLOR_UNKNOWN', 0],
      ['WIRE_SIZE_UNKNOWN', 1],
      ['WIRE_ENDS_MISSING', 1],
      ['VOLTAGE_DROP_HIGH', 2],
    ]);
    expect(f.summary.splices).toBe(6);
  });
});
