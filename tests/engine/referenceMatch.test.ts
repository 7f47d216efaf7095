import { describe, expect, it } from 'vitest';
import { checkReferenceMatch, MIN_BAND_TOLERANCE_MEV } from '@/lib/engine/compare/checkReferenceMatch';
import { HC_EV_NM } from '@/lib/engine/constants';

// Energies from λ with hc = 1239.841984 eV·nm (CODATA 2018).
const ev = (nm: number) => HC_EV_NM / nm;
const abs = (bandNm: number | null, fwhmMeV: number | null = 120) => ({
  technique: 'absorption' as const,
  rangeEv: [ev(800), ev(350)] as const,
  bandEv: bandNm === null ? null : ev(bandNm),
  fwhmMeV,
});

describe('checkReferenceMatch', () => {
  it('refuses a CdSe batch of another size: 485 nm against a 577 nm parent (~400 meV apart, common practice)', () => {
    const v = checkReferenceMatch(abs(485), abs(577));
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.reason).toMatch(/first excitons 2\.556 eV vs 2\.149 eV/);
  });

  it('accepts a Stark-like shift of 14 meV on a 120 meV wide exciton (Empedocles & Bawendi 1997: tens of meV)', () => {
    const parent = abs(577);
    const shifted = { ...parent, bandEv: parent.bandEv! - 0.014 };
    expect(checkReferenceMatch(shifted, parent)).toEqual({ ok: true, toleranceMeV: 120 });
  });

  it('uses the floor on narrow bands and refuses just past it', () => {
    const parent = abs(577, 20);
    const near = { ...parent, bandEv: parent.bandEv! + (MIN_BAND_TOLERANCE_MEV - 1) / 1000 };
    const far = { ...parent, bandEv: parent.bandEv! + (MIN_BAND_TOLERANCE_MEV + 1) / 1000 };
    expect(checkReferenceMatch(near, parent).ok).toBe(true);
    expect(checkReferenceMatch(far, parent).ok).toBe(false);
  });

  it('refuses another technique and names both', () => {
    const v = checkReferenceMatch(abs(577), { ...abs(577), technique: 'pl' });
    expect(v).toEqual({ ok: false, reason: 'the reference does not match this sample: the sample is absorption, the reference pl' });
  });

  it('refuses ranges that barely overlap', () => {
    const v = checkReferenceMatch(abs(577), { ...abs(577), rangeEv: [ev(1600), ev(780)] });
    expect(v.ok).toBe(false);
  });

  it('accepts when a band is unknown on either side (nothing to compare yet)', () => {
    expect(checkReferenceMatch(abs(null), abs(577))).toEqual({ ok: true, toleranceMeV: null });
  });
});
