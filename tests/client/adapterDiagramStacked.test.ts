// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { checkAdapter } from '../../shared/check';
import type { AdapterInput } from '../../shared/schemas/adapter';
import {
  STACK,
  STACK_BELOW,
  STACK_MAX_CIRCUITS,
  buildDiagram,
  wrapWords,
  type DiagramModel,
} from '../../src/components/adapter/diagramModel';

const input: AdapterInput = {
  ends: {
    A: {
      label: 'Engine control module plug C2, the grey one behind the battery tray',
      cavityCount: 12,
      sealed: true,
      view: 'wire-side',
      layout: { rows: 2, cols: 6 },
    },
    B: {
      label: 'Bulkhead plug',
      cavityCount: 8,
      view: 'mating-face',
      layout: { rows: 2, cols: 4 },
    },
  },
  circuits: [
    { a: ['1'], b: ['1'], color: 'RD', size: '1 mm2' },
    { a: ['2'], b: ['2'], color: 'RD/GN', size: '0.75 mm2' },
    { a: ['3', '4'], b: ['3'], color: 'BK', size: '1.5 mm2' },
    { a: ['5'], b: [], termination: 'ring terminal (M6) to the front ground stud', color: 'GN/YE' },
    { a: [], b: ['4'], color: 'WH/BU', size: '0.5 mm2' },
    { a: ['6'], b: ['5'], termination: 'ring terminal to ground', color: 'BN' },
    { a: ['7'], b: ['Z'], color: 'GY' },
    { a: ['8'], b: [], color: 'VT' },
  ],
};
const report = checkAdapter(input);

/** The box a text covers, from the same character widths the model fits text with. */
function textBox(x: number, chars: number, charW: number, anchor: string) {
  const w = chars * charW;
  const left = anchor === 'start' ? x : anchor === 'end' ? x - w : x - w / 2;
  return { left, right: left + w };
}

function expectInside(model: DiagramModel) {
  const inside = (left: number, right: number, what: string) => {
    expect(left, what).toBeGreaterThanOrEqual(0);
    expect(right, what).toBeLessThanOrEqual(model.width);
  };
  for (const end of [model.ends.A, model.ends.B]) {
    inside(end.x, end.x + end.w, `end ${end.side} housing`);
    for (const t of end.texts) {
      const charW = t.kind === 'title' ? STACK.titleChar : 6.8;
      const b = textBox(t.x, t.text.length, charW, t.anchor);
      inside(b.left, b.right, t.text);
    }
  }
  for (const w of model.wires) {
    const plate = w.label.plate!;
    inside(plate.x, plate.x + plate.w, w.label.text);
    for (const t of w.terminals) {
      for (const line of t.lines) {
        const b = textBox(t.tx, line.length, STACK.termChar, t.anchor);
        inside(b.left, b.right, line);
      }
    }
  }
}

describe('the stacked adapter diagram (phones)', () => {
  const model = buildDiagram(input, report, {}, { width: 343 });

  it('stacks end A above end B and fits the width it is given', () => {
    expect(model.layout).toBe('stacked');
    expect(model.width).toBe(343);
    expect(model.ends.B.y).toBeGreaterThan(model.ends.A.y + model.ends.A.h);
    expectInside(model);
  });

  it('keeps every circuit with its printed code, each code on a row of its own', () => {
    expect(model.wires.map((w) => w.label.text)).toEqual([
      '1  RD  1 mm²',
      '2  RD/GN  0.75 mm²',
      '3  BK  1.5 mm²',
      '4  GN/YE',
      '5  WH/BU  0.5 mm²',
      '6  BN',
      '7  GY',
      '8  VT',
    ]);
    const plates = model.wires.map((w) => w.label.plate!).sort((p, q) => p.y - q.y);
    for (let k = 1; k < plates.length; k++) {
      expect(plates[k].y).toBeGreaterThanOrEqual(plates[k - 1].y + plates[k - 1].h);
    }
    // Codes go down in circuit order.
    const ys = model.wires.map((w) => w.label.y);
    expect([...ys].sort((p, q) => p - q)).toEqual(ys);
  });

  it('gives each circuit a lane of its own and keeps the splice, terminals and open end', () => {
    // The code sits 8 px beside its lane.
    const lanes = model.wires.map((w) => w.label.x + (w.label.anchor === 'start' ? -8 : 8));
    expect(new Set(lanes).size).toBe(model.wires.length);
    const [, , spliced, grounded, fromB, pigtail, stray, open] = model.wires;
    expect(spliced.joins).toHaveLength(1);
    expect(grounded.terminals[0].lines.join(' ')).toBe(
      'ring terminal (M6) to the front ground stud',
    );
    expect(grounded.terminals[0].ring.y).toBeGreaterThan(grounded.terminals[0].barrel.y);
    expect(fromB.opens).toHaveLength(1);
    expect(pigtail.joins).toHaveLength(1);
    expect(pigtail.terminals).toHaveLength(1);
    expect(stray.strays[0].text).toBe('Z?');
    expect(open.opens).toHaveLength(1);
    // Words of terminals do not run into any code plate.
    for (const w of model.wires) {
      for (const t of w.terminals) {
        for (const other of model.wires) {
          const p = other.label.plate!;
          const b = textBox(
            t.tx,
            Math.max(...t.lines.map((l) => l.length)),
            STACK.termChar,
            t.anchor,
          );
          const top = t.ty - 9;
          const bottom = t.ty + (t.lines.length - 1) * 13 + 3;
          const overlaps = b.left < p.x + p.w && b.right > p.x && top < p.y + p.h && bottom > p.y;
          expect(overlaps, `${t.text} over ${other.label.text}`).toBe(false);
        }
      }
    }
  });

  it('wraps the title and the legend instead of running past the edge', () => {
    const titles = model.ends.A.texts.filter((t) => t.kind === 'title');
    expect(titles.length).toBeGreaterThan(1);
    expect(titles.map((t) => t.text).join(' ')).toContain('Engine control module plug C2');
    const wire = model.legend.find((l) => l.key === 'wire')!;
    expect(wire.lines.length).toBeGreaterThan(1);
    for (const l of model.legend) {
      for (const line of l.lines)
        expect(model.legendX + l.x + 28 + line.length * 6.4).toBeLessThanOrEqual(model.width);
    }
  });

  it('stays side by side when wide, for print, and for very long adapters', () => {
    expect(buildDiagram(input, report).layout).toBe('wide');
    expect(buildDiagram(input, report, {}, { width: STACK_BELOW }).layout).toBe('wide');
    const long: AdapterInput = {
      ...input,
      circuits: Array.from({ length: STACK_MAX_CIRCUITS + 1 }, (_, k) => ({
        a: [String((k % 12) + 1)],
        b: [String((k % 8) + 1)],
        color: 'BK',
      })),
    };
    expect(buildDiagram(long, checkAdapter(long), {}, { width: 343 }).layout).toBe('wide');
  });

  it('grows past the width only when a housing is wider than it', () => {
    const wideEnd: AdapterInput = {
      ...input,
      ends: { ...input.ends, A: { cavityCount: 20, layout: { rows: 2, cols: 10 } } },
    };
    const m = buildDiagram(wideEnd, checkAdapter(wideEnd), {}, { width: 343 });
    expect(m.width).toBe(10 * 40 + 28 + 2 * STACK.margin);
    expectInside(m);
  });
});

describe('wrapWords', () => {
  it('breaks at spaces and clips past the last line', () => {
    expect(wrapWords('End A · Engine control module plug C2', 16)).toEqual([
      'End A · Engine',
      'control module',
      'plug C2',
    ]);
    expect(wrapWords('one two three four', 9, 2)).toEqual(['one two', 'three fo…']);
  });
});
