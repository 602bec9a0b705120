// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import CautionBlock from '@/components/CautionBlock.vue';
import { CAUTION_KINDS, CAUTIONS } from '@/components/cautions';

const global = { plugins: [[Quasar, {}]] as [typeof Quasar, object][] };

describe('CautionBlock', () => {
  it.each(CAUTION_KINDS)('shows the default wording of the %s kind', (kind) => {
    const wrapper = mount(CautionBlock, { props: { kind }, global });
    expect(wrapper.text()).toContain(CAUTIONS[kind].title);
    expect(wrapper.text()).toContain(CAUTIONS[kind].text);
  });

  it('says what each kind is about in words, not colour alone', () => {
    const text = (kind: (typeof CAUTION_KINDS)[number]) =>
      mount(CautionBlock, { props: { kind }, global }).text();
    expect(text('battery')).toMatch(/disconnect the (negative )?battery/i);
    expect(text('fuel')).toMatch(/depressurise fuel lines/i);
    expect(text('airbag')).toMatch(/never probe airbag \(SRS\) circuits/i);
    expect(text('airbag')).toMatch(/disarming procedure/i);
    expect(text('high-current')).toMatch(/fuse every new feed close to the source/i);
    expect(text('heat')).toMatch(/exhaust heat/i);
    expect(text('heat')).toMatch(/moving parts/i);
  });

  it('is a labelled note with an icon and a visible "Caution" label', () => {
    const wrapper = mount(CautionBlock, { props: { kind: 'fuel' }, global });
    const note = wrapper.get('[role="note"]');
    const labelId = note.attributes('aria-labelledby');
    expect(labelId).toBeTruthy();
    expect(wrapper.get(`#${labelId}`).text()).toContain('Caution:');
    expect(wrapper.find('.q-icon').exists()).toBe(true);
    expect(wrapper.find('.q-icon').attributes('aria-hidden')).toBe('true');
  });

  it('takes a custom title and extra text in its slot', () => {
    const wrapper = mount(CautionBlock, {
      props: { kind: 'high-current', title: 'Fuse the new fan feed' },
      slots: { default: '<p>Use a 30 A fuse within 150 mm of the battery post.</p>' },
      global,
    });
    expect(wrapper.text()).toContain('Fuse the new fan feed');
    expect(wrapper.text()).not.toContain(CAUTIONS['high-current'].title);
    expect(wrapper.text()).toContain(CAUTIONS['high-current'].text);
    expect(wrapper.text()).toContain('within 150 mm');
  });

  it('defaults to the general caution', () => {
    const wrapper = mount(CautionBlock, { global });
    expect(wrapper.text()).toContain(CAUTIONS.general.title);
    expect(wrapper.text()).toMatch(/service information, local regulations and licensed practice/);
  });

  it('gives two blocks on one page different heading ids', () => {
    const Both = {
      components: { CautionBlock },
      template: '<div><caution-block kind="fuel" /><caution-block kind="heat" /></div>',
    };
    const wrapper = mount(Both, { global });
    const ids = wrapper.findAll('[role="note"]').map((n) => n.attributes('aria-labelledby'));
    expect(new Set(ids).size).toBe(2);
  });
});
