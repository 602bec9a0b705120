// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { nextTick } from 'vue';
import { Notify, Quasar } from 'quasar';
import PinMap from '@/components/connector/PinMap.vue';
import PinTableEditor from '@/components/connector/PinTableEditor.vue';
import {
  MIN_PITCH,
  MIN_TEXT_PX,
  buildPinMap,
  describeCavity,
  pinMapGeometry,
  placeCavity,
  sizeText,
  wirePaint,
} from '@/components/connector/pinMapModel';
import { emptyPin, type PinRow } from '@/components/connector/pinTable';

const global = { plugins: [[Quasar, { plugins: { Notify } }]] as [typeof Quasar, object][] };

const sheet = {
  cavityCount: 6,
  labels: 'numeric' as const,
  layout: { rows: 2, cols: 3 },
  view: 'mating-face' as const,
  housing: 'socket' as const,
  pins: [
    { cavity: '1', role: '5 V reference', color: 'GY', size: '20 AWG' },
    { cavity: '2', role: 'signal', color: 'green/yellow', size: '0.5 mm2' },
    { cavity: '3', role: 'ground', color: 'XX' },
  ],
};

describe('pin map model', () => {
  it('paints base and tracer from the colour code and keeps unknown codes as written', () => {
    expect(wirePaint('GN/YE')).toMatchObject({
      ok: true,
      code: 'GN/YE',
      base: '#2e9b45',
      stripe: '#f7d31e',
    });
    expect(wirePaint('GNYE')).toMatchObject({ ok: true, code: 'GNYE', stripe: '#f7d31e' });
    expect(wirePaint('XX')).toMatchObject({ ok: false, code: 'XX' });
    expect(wirePaint('')).toMatchObject({ ok: false, text: '' });
  });

  it('mirrors the drawing left to right with the shared layout, and says so', () => {
    const plain = buildPinMap(sheet, false);
    const mirrored = buildPinMap(sheet, true);
    const at = (m: typeof plain, label: string) => m.cavities.find((c) => c.label === label)!;
    expect(plain.shownView).toBe('mating-face');
    expect(mirrored.shownView).toBe('wire-side');
    expect([at(plain, '1').row, at(plain, '1').col]).toEqual([0, 0]);
    expect([at(mirrored, '1').row, at(mirrored, '1').col]).toEqual([0, 2]);
    expect(at(mirrored, '2').pin?.role).toBe('signal');
  });

  it('describes a cavity in words and prints sizes the standard way', () => {
    const c = buildPinMap(sheet, false).cavities.find((x) => x.label === '2')!;
    expect(describeCavity(c)).toBe('Cavity 2: signal, GN/YE (green with a yellow tracer), 0.5 mm²');
    expect(sizeText('18awg')).toBe('18 AWG');
    expect(sizeText('eighteen')).toBe('eighteen');
  });
});

describe('pin map geometry', () => {
  /** The box a pin map has on a 375 px phone. */
  const PHONE_BOX = 317;
  const cavity = (label: string, row: number, col: number, color = 'BK/WH') => ({
    label,
    row,
    col,
    paint: wirePaint(color),
  });

  it('keeps the natural drawing where there is room, on paper and while unmeasured', () => {
    for (const available of [undefined, 1200]) {
      const geo = pinMapGeometry(2, 6, { available });
      expect(geo).toMatchObject({ mode: 'natural', fits: true, px: 92, codeSize: 13 });
      expect(geo.drawWidth).toBe(geo.width);
    }
    // A small plug is drawn larger than natural, and still shrinks readably into a phone.
    expect(pinMapGeometry(1, 3, { available: PHONE_BOX })).toMatchObject({
      mode: 'natural',
      drawWidth: Math.round(pinMapGeometry(1, 3).width * 1.25),
    });
  });

  it('pitches a wide plug to a phone’s box, drawn 1:1 with text of 10 px or more', () => {
    const geo = pinMapGeometry(2, 6, { available: PHONE_BOX });
    expect(geo).toMatchObject({ mode: 'narrow', fits: true, width: PHONE_BOX });
    expect(geo.drawWidth).toBe(PHONE_BOX);
    expect(geo.px).toBeGreaterThanOrEqual(MIN_PITCH);
    expect(geo.body.x).toBeGreaterThanOrEqual(0);
    expect(geo.body.x + geo.body.w).toBeLessThanOrEqual(geo.width);
    expect(geo.codeSize).toBeGreaterThanOrEqual(MIN_TEXT_PX);

    const first = placeCavity(geo, cavity('1', 0, 0));
    const last = placeCavity(geo, cavity('12', 1, 5));
    // The code sits centred under its swatch, under its hole, and inside the drawing.
    expect(first).toMatchObject({ codeAnchor: 'middle', codeX: first.cx, codeText: 'BK/WH' });
    expect(first.codeY).toBeGreaterThan(first.sy + geo.sh);
    const halfCode = (first.codeText.length * 0.62 * geo.codeSize) / 2;
    expect(first.cx - halfCode).toBeGreaterThan(geo.body.x);
    expect(last.cx + halfCode).toBeLessThan(geo.body.x + geo.body.w);
    expect(last.codeY + geo.codeSize / 2).toBeLessThan(geo.body.y + geo.body.h);
    expect(last.labelSize).toBeGreaterThanOrEqual(MIN_TEXT_PX);
    expect(placeCavity(geo, cavity('A12B', 0, 0)).labelSize).toBeGreaterThanOrEqual(MIN_TEXT_PX);
    // A code longer than the pitch holds ends in an ellipsis (the table has it in full).
    expect(placeCavity(geo, cavity('1', 0, 0, 'GN/YE/BK')).codeText).toMatch(/^GN\/Y.*…$/);
  });

  it('says when even the narrowest readable pitch is wider than the box', () => {
    const geo = pinMapGeometry(2, 13, { available: PHONE_BOX });
    expect(geo).toMatchObject({ mode: 'narrow', fits: false, px: MIN_PITCH });
    expect(geo.width).toBeGreaterThan(PHONE_BOX);
  });

  it('draws the natural code beside its swatch as before', () => {
    const geo = pinMapGeometry(2, 3);
    const c = placeCavity(geo, cavity('2', 0, 1, 'GN/YE'));
    expect(c).toMatchObject({ codeAnchor: 'start', codeX: c.sx + geo.sw + 4, codeText: 'GN/YE' });
    expect(c.codeY).toBe(c.sy + geo.sh / 2);
    expect(placeCavity(geo, cavity('2', 0, 1, 'ABCDEFGHIJ')).codeText).toBe('ABCDEFGH…');
  });
});

describe('PinMap', () => {
  it('prints the view side on the drawing and the code beside every swatch', async () => {
    const wrapper = mount(PinMap, { props: { content: sheet }, global });
    expect(wrapper.get('text.lw-pinmap__viewtext').text()).toBe('Viewed from: mating face');
    const codes = wrapper.findAll('text.lw-pinmap__code').map((t) => t.text());
    expect(codes).toEqual(expect.arrayContaining(['GY', 'GN/YE', 'XX']));
    // Every swatch has an outline, so white and yellow stay visible.
    expect(wrapper.findAll('rect.lw-pinmap__swatch-line')).toHaveLength(3);
    await wrapper.get('[data-test="mirror"]').trigger('click');
    expect(wrapper.get('text.lw-pinmap__viewtext').text()).toBe('Viewed from: wire side');
    expect(wrapper.emitted('update:mirrored')).toEqual([[true]]);
  });

  it('draws a compact thumbnail without text or controls', () => {
    const wrapper = mount(PinMap, { props: { content: sheet, compact: true }, global });
    expect(wrapper.find('[data-test="mirror"]').exists()).toBe(false);
    expect(wrapper.find('table').exists()).toBe(false);
    expect(wrapper.find('svg').attributes('aria-label')).toMatch(
      /6 cavities, viewed from mating face/,
    );
  });
});

describe('PinTableEditor keyboard', () => {
  function mountTable(rows: PinRow[]) {
    const wrapper = mount(PinTableEditor, {
      props: {
        modelValue: rows,
        'onUpdate:modelValue': (next: PinRow[]) => wrapper.setProps({ modelValue: next }),
      },
      global,
      attachTo: document.body,
    });
    return wrapper;
  }
  const cell = (row: number, col: number) =>
    document.querySelector<HTMLInputElement>(`input[data-row="${row}"][data-col="${col}"]`)!;

  it('moves Enter down the same column and adds a row below the last', async () => {
    const wrapper = mountTable([emptyPin('1'), emptyPin('2')]);
    cell(0, 2).focus();
    cell(0, 2).dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true }));
    await nextTick();
    await nextTick();
    expect(document.activeElement).toBe(cell(1, 2));
    cell(1, 2).dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true }));
    await nextTick();
    await nextTick();
    expect(wrapper.props('modelValue')).toHaveLength(3);
    expect(document.activeElement).toBe(cell(2, 2));
    cell(2, 2).dispatchEvent(
      new KeyboardEvent('keydown', { key: 'Enter', shiftKey: true, bubbles: true }),
    );
    await nextTick();
    expect(document.activeElement).toBe(cell(1, 2));
    wrapper.unmount();
  });

  it('fills from the focused cell when spreadsheet rows are pasted', async () => {
    const wrapper = mountTable([emptyPin('1'), emptyPin('2')]);
    const event = new Event('paste', { bubbles: true, cancelable: true }) as ClipboardEvent;
    Object.defineProperty(event, 'clipboardData', {
      value: { getData: () => 'signal\tGN/YE\t20 AWG\nground\tBK\t18 AWG\n' },
    });
    cell(0, 1).dispatchEvent(event);
    await nextTick();
    expect(event.defaultPrevented).toBe(true);
    const rows = wrapper.props('modelValue') as PinRow[];
    expect(rows.map((r) => [r.cavity, r.role, r.color, r.size])).toEqual([
      ['1', 'signal', 'GN/YE', '20 AWG'],
      ['2', 'ground', 'BK', '18 AWG'],
    ]);
    wrapper.unmount();
  });

  it('shows a message beside the cell it is about', () => {
    const wrapper = mount(PinTableEditor, {
      props: {
        modelValue: [{ ...emptyPin('1'), color: 'XX' }],
        issues: [{ row: 0, col: 'color', message: '"XX" is not a known wire colour.' }],
      },
      global,
    });
    const input = wrapper.get('input[data-field="color"]');
    expect(input.attributes('aria-invalid')).toBe('true');
    const msg = wrapper.get(`#${input.attributes('aria-describedby')}`);
    expect(msg.text()).toContain('"XX" is not a known wire colour.');
  });
});
