import { describe, expect, it } from 'vitest';
import { checkAdapter } from '@shared/check';

// Facts of the trade: common practice, no published source.

describe('common practice', () => {
  it('a three-wire sensor carries a 5 V reference, a signal and a low reference at a few mA', () => {
    // Common practice: three-wire sensor roles; its current is a few milliamperes, so even
    // a long run of thin wire shows no meaningful drop.
    const roles = { '1': '5 V reference', '2': 'signal', '3': 'low reference' };
    const r = checkAdapter({
      ends: {
        A: { label: '3-cavity sensor plug', cavityCount: 3, sealed: true, roles },
        B: { label: '3-cavity relocation pigtail', cavityCount: 3, roles },
      },
      circuits: [
        {
          a: ['1'],
          b: ['1'],
          role: '5 V reference',
          size: '22 AWG',
          lengthMm: 3000,
          currentA: 0.01,
        },
        { a: ['2'], b: ['2'], role: 'signal', size: '22 AWG', lengthMm: 3000, currentA: 0.005 },
        {
          a: ['3'],
          b: ['3'],
          role: 'low reference',
          size: '22 AWG',
          lengthMm: 3000,
          currentA: 0.01,
        },
      ],
    });
    expect(r.ok).toBe(true);
    expect(r.warnings).toEqual([]);
  });

  it('a saturated injector coil at about 1 A over a long thin run is flagged', () => {
    // Common practice: about 1 A per injector. 1 A × 0.017241 × 8 m / 0.2047 mm² = 0.674 V = 5.6 %.
    const r = checkAdapter({
      ends: { A: { cavityCount: 2 }, B: { cavityCount: 2 } },
      circuits: [
        {
          a: ['1'],
          b: ['1'],
          role: 'switched ignition feed',
          size: '24 AWG',
          lengthMm: 4000,
          currentA: 1,
        },
        { a: ['2'], b: ['2'], role: 'signal', size: '24 AWG', lengthMm: 4000, currentA: 1 },
      ],
    });
    expect(r.warnings.filter((w) => w.code === 'VOLTAGE_DROP_HIGH').map((w) => w.circuit)).toEqual([
      0, 1,
    ]);
  });

  it('an 8-cavity sealed plug converted to a 6-cavity plug carrying 6 circuits checks clean', () => {
    // Common practice: the larger end keeps two empty cavities, each filled with a cavity plug.
    const r = checkAdapter({
      ends: {
        A: { label: '8-cavity sealed module plug', cavityCount: 8, sealed: true },
        B: { label: '6-cavity harness plug', cavityCount: 6, sealed: false },
      },
      circuits: Array.from({ length: 6 }, (_, i) => ({ a: [String(i + 1)], b: [String(i + 1)] })),
    });
    expect(r.ok).toBe(true);
    expect(r.warnings.map((w) => [w.code, w.end, w.cavity])).toEqual([
      ['CAVITY_UNUSED', 'A', '7'],
      ['CAVITY_UNUSED', 'A', '8'],
    ]);
    expect(r.summary.ends.A.plugsNeeded).toBe(2);
    expect(r.summary.ends.B).toEqual({ cavities: 6, used: 6, unused: [], plugsNeeded: 0 });
  });
});
