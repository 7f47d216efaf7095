import { describe, expect, it } from 'vitest';
import { analyzeSpectrum, type ParsedSpectrum } from '../../lib/engine/index';
import { absorbanceSpectrum, makeRng, plSpectrum, PARENT_BANDS, HC, type Band } from './synthetic';

// Engine 2 (issue #10): every expected value below comes from the noise-free model that generated
// the spectra (tests/engine/synthetic.ts and the helpers here), never from the engine's output.
// The rule each check tests is named beside it with its source or "common practice".

const kinds = (r: ReturnType<typeof analyzeSpectrum>) => r.flags.map((f) => f.kind).sort();
const flag = (r: ReturnType<typeof analyzeSpectrum>, kind: string) => r.flags.find((f) => f.kind === kind);
const noise = 0.002;
const ref = absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed: 1 });
/** Parent absorbance at the first exciton (2.2 eV) from the generator: band 1 + band 2 + band 3 + continuum (0 below 2.3 eV). */
const parentAt = (e: number, bands: Band[] = PARENT_BANDS, background = 0.05) =>
  bands.reduce((a, b) => a + b.a * Math.exp(-0.5 * ((e - b.e) / b.sigma) ** 2), 0) + background * Math.max(0, e - 2.3) ** 1.5;
const A1 = parentAt(2.2);
const scaled = (k: number, bleach = 0) => PARENT_BANDS.map((b, i) => ({ ...b, a: b.a * k * (i === 0 ? 1 - bleach : 1) }));
/** Adds f(E) to a copy of a spectrum (x in nm). */
function plus(s: ParsedSpectrum, f: (eV: number, nm: number) => number): ParsedSpectrum {
  const y = Float64Array.from(s.y, (v, i) => v + f(HC / s.x[i]!, s.x[i]!));
  return { ...s, y };
}

describe('1. concentration is separated from band changes (continuum scaling, common practice; Yu et al. 2003)', () => {
  it('a 0.70× dilution is a concentration ratio 0.70 ± 0.02, never a bleach', () => {
    const s = absorbanceSpectrum({ bands: scaled(0.7), noise, seed: 41, background: 0.05 * 0.7 });
    const r = analyzeSpectrum(s, { reference: ref });
    expect(kinds(r)).toEqual(['concentration']);
    const c = flag(r, 'concentration')!;
    expect(c.unit).toBe('ratio');
    expect(Math.abs(c.magnitude - 0.7)).toBeLessThan(0.02);
    expect(r.parameters.normalization.details.applied).toBe('fit');
    expect(r.parameters.normalization.details.reason).toMatch(/continuum/);
  });
  for (const [k, bleach] of [
    [0.8, 0.31],
    [0.7, 0.2],
  ] as const) {
    it(`a ${bleach * 100} % bleach of band 1 inside a ${k}× dilution reads the bleach, not bleach + dilution`, () => {
      const s = absorbanceSpectrum({ bands: scaled(k, bleach), noise, seed: 42, background: 0.05 * k });
      const r = analyzeSpectrum(s, { reference: ref });
      // truth: the band-1 share of the parent's absorbance at 2.2 eV that is removed
      const truth = (bleach * PARENT_BANDS[0]!.a) / A1;
      expect(Math.abs(flag(r, 'bleach')!.fraction! - truth)).toBeLessThan(0.02);
      expect(Math.abs(flag(r, 'concentration')!.magnitude - k)).toBeLessThan(0.02);
    });
  }
  it('the opposite: a 30 % bleach at the same concentration is a bleach and no concentration flag', () => {
    const r = analyzeSpectrum(absorbanceSpectrum({ bands: scaled(1, 0.3), noise, seed: 43 }), { reference: ref });
    expect(kinds(r)).toEqual(['bleach']);
    expect(Math.abs(r.flags[0]!.fraction! - (0.3 * 0.5) / A1)).toBeLessThan(0.02);
  });
  it('explicit choices stay: mode none reads the 0.70× dilution as a bleach, and says so', () => {
    const s = absorbanceSpectrum({ bands: scaled(0.7), noise, seed: 41, background: 0.035 });
    const r = analyzeSpectrum(s, { reference: ref, normalization: { mode: 'none' } });
    expect(kinds(r)).toContain('bleach');
    expect(r.parameters.normalization.details.reason).toMatch(/chosen by the caller/);
  });
});

describe('2. smooth backgrounds are not bands (common practice: cuvette mismatch, Rayleigh scattering ∝ λ⁻⁴)', () => {
  it('a baseline slope of 0.05 A/eV on the sample only raises nothing', () => {
    const s = plus(absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed: 44 }), (e) => 0.05 * (e - 1.65));
    expect(analyzeSpectrum(s, { reference: ref }).flags).toEqual([]);
  });
  it('a λ⁻⁴ scattering tail on the sample only (0.08 at 350 nm) raises nothing', () => {
    const s = plus(absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed: 45 }), (_e, nm) => 0.08 * (350 / nm) ** 4);
    const r = analyzeSpectrum(s, { reference: ref });
    expect(r.flags).toEqual([]);
    expect(r.parameters.normalization.details.background?.scatterPower).not.toBeNull();
  });
  it('a 20 % bleach inside that scattering reads 20 % of band 1 (±0.02)', () => {
    const s = plus(absorbanceSpectrum({ bands: scaled(1, 0.2), noise, seed: 46 }), (_e, nm) => 0.08 * (350 / nm) ** 4);
    const r = analyzeSpectrum(s, { reference: ref });
    expect(kinds(r)).toEqual(['bleach']);
    expect(Math.abs(r.flags[0]!.fraction! - (0.2 * 0.5) / A1)).toBeLessThan(0.02);
  });
  it('the opposite: a real sub-gap band at 1.85 eV on a sloped baseline is still one new band (±15 meV)', () => {
    const s = plus(
      absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed: 47, newBand: { e: 1.85, sigma: 0.05, a: 0.06 } }),
      (e) => 0.05 * (e - 1.65),
    );
    const r = analyzeSpectrum(s, { reference: ref });
    const nb = r.flags.filter((f) => f.kind === 'new-band');
    expect(nb).toHaveLength(1);
    expect(Math.abs(nb[0]!.energyEv! - 1.85)).toBeLessThan(0.015);
  });
});

describe('3. a reference that does not match is not compared (checkReferenceMatch; common practice)', () => {
  // first excitons 2.557 eV (485 nm) vs 2.148 eV (577 nm), as the real CdSe case of the issue
  const band = (e: number): Band[] => [
    { e, sigma: 0.05, a: 0.4 },
    { e: e + 0.2, sigma: 0.07, a: 0.3 },
    { e: e + 0.7, sigma: 0.15, a: 0.5 },
  ];
  it('485 nm against a 577 nm parent: no band flags, the reason names both first excitons', () => {
    const parent = absorbanceSpectrum({ bands: band(HC / 577), noise, seed: 48, background: 0 });
    const other = absorbanceSpectrum({ bands: band(HC / 485), noise, seed: 49, background: 0 });
    const r = analyzeSpectrum(other, { reference: parent });
    expect(r.flags).toEqual([]);
    expect(r.referenceMatch?.ok).toBe(false);
    expect(r.referenceMatch?.reason).toMatch(/first excitons 2\.5\d\d eV vs 2\.1\d\d eV/);
  });
  // ±1.5 meV here: the band overlaps the next transition, which stays put (a single band gets ±1 meV, section 5)
  it('the opposite: a 15 meV red shift of the same parent is compared (a shift flag, ±1.5 meV)', () => {
    const parent = absorbanceSpectrum({ bands: band(2.15), noise, seed: 50, background: 0 });
    const shifted = absorbanceSpectrum({
      bands: band(2.15).map((b, i) => (i === 0 ? { ...b, e: b.e - 0.015 } : b)),
      noise,
      seed: 51,
      background: 0,
    });
    const r = analyzeSpectrum(shifted, { reference: parent });
    expect(r.referenceMatch?.ok).toBe(true);
    expect(Math.abs(flag(r, 'shift')!.shiftMeV! + 15)).toBeLessThan(1.5);
  });
});

/** Mid-IR absorbance on 4000→1000 cm⁻¹ (2 cm⁻¹ steps); `extra` adds to the ligand model (positions from memory, DOMAIN.md). */
function midIr(seed: number, o: { ch?: number; extra?: (cm1: number) => number } = {}): ParsedSpectrum {
  const rng = makeRng(seed);
  const n = 1501;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  const g = (k: number, c: number, s: number) => Math.exp(-0.5 * ((k - c) / s) ** 2);
  for (let i = 0; i < n; i++) {
    const k = 1000 + 2 * i;
    const ch = (o.ch ?? 1) * (0.25 * g(k, 2925, 18) + 0.18 * g(k, 2855, 15));
    x[i] = k;
    y[i] = 0.02 + ch + 0.06 * g(k, 1460, 20) + (o.extra ? o.extra(k) : 0) + 0.0015 * rng();
  }
  return {
    fileName: `ir-${seed}.csv`,
    format: 'delimited',
    x,
    y,
    xUnit: 'cm-1',
    yUnit: 'absorbance',
    xOrderInFile: 'ascending',
    technique: 'ir',
    columnName: 'A',
    columnIndex: 1,
    availableColumns: ['A'],
    metadata: {},
    warnings: [],
  };
}
/** CO₂ residue: P and R branches near 2340 and 2360 cm⁻¹ (from memory), 0.03 absorbance. */
const co2 = (k: number) => 0.03 * (Math.exp(-0.5 * ((k - 2340) / 8) ** 2) + Math.exp(-0.5 * ((k - 2360) / 8) ** 2));
/** Water-vapour-like lines: narrow (σ 1.5 cm⁻¹) lines every 17 cm⁻¹ from 1320 to 1880 cm⁻¹, 0.02 absorbance. */
const water = (k: number) => {
  let v = 0;
  for (let c = 1320; c <= 1880; c += 17) v += 0.02 * Math.exp(-0.5 * ((k - c) / 1.5) ** 2);
  return v;
};

describe('4. mid-IR: atmosphere masked, changed bands are band changes, intraband only for broad new bands', () => {
  const irRef = midIr(60);
  it('a CO₂ residue at 2340/2360 cm⁻¹ raises no flag and is named as present', () => {
    const r = analyzeSpectrum(midIr(61, { extra: co2 }), { reference: irRef });
    expect(r.flags).toEqual([]);
    expect(r.atmosphericBands.find((b) => b.name.startsWith('CO₂ asym'))?.present).toBe(true);
  });
  it('water-vapour lines (1300–1900 cm⁻¹) raise no flag and are named as present', () => {
    const r = analyzeSpectrum(midIr(62, { extra: water }), { reference: irRef });
    expect(r.flags).toEqual([]);
    expect(r.atmosphericBands.find((b) => b.name.includes('bend') && b.name.includes('water'))?.present).toBe(true);
  });
  it('C–H stretches 10 % stronger: no flag (below minBandChangeFraction 0.20, and not a new band)', () => {
    expect(analyzeSpectrum(midIr(63, { ch: 1.1 }), { reference: irRef }).flags).toEqual([]);
  });
  it('C–H stretches 50 % stronger: band changes of ratio 1.5 ± 0.05 at 2925 and 2855 cm⁻¹, no new band', () => {
    const r = analyzeSpectrum(midIr(64, { ch: 1.5 }), { reference: irRef });
    expect(kinds(r)).toEqual(['band-change', 'band-change']);
    for (const f of r.flags) {
      expect(Math.abs(f.magnitude - 0.5)).toBeLessThan(0.05);
      expect(f.bandRole).toBe('vibrational-band');
    }
  });
  it('the opposite: a broad intraband band at 2180 cm⁻¹ (σ 150 cm⁻¹) beside a CO₂ residue is one intraband candidate with its width', () => {
    const band = (k: number) => 0.05 * Math.exp(-0.5 * ((k - 2180) / 150) ** 2);
    const r = analyzeSpectrum(midIr(65, { extra: (k) => band(k) + co2(k) }), { reference: irRef });
    expect(kinds(r)).toEqual(['new-band']);
    const f = r.flags[0]!;
    expect(Math.abs(f.energyEv! * 8065.54394 - 2180)).toBeLessThan(30);
    expect(f.intraband).toBe(true);
    expect(f.bandRole).toBe('intraband-candidate');
    // truth FWHM = 2.3548·150 cm⁻¹ = 353 cm⁻¹, ±15 % (derivative-window smoothing and masking)
    const widthCm1 = (f.widthMeV! / 1000) * 8065.54394;
    expect(Math.abs(widthCm1 - 353.2) / 353.2).toBeLessThan(0.15);
  });
  it('a narrow new band (σ 10 cm⁻¹) at 2000 cm⁻¹ is a new vibrational band, not an intraband candidate', () => {
    const r = analyzeSpectrum(midIr(66, { extra: (k) => 0.05 * Math.exp(-0.5 * ((k - 2000) / 10) ** 2) }), { reference: irRef });
    expect(kinds(r)).toEqual(['new-band']);
    expect(r.flags[0]!.intraband).toBe(false);
    expect(r.flags[0]!.bandRole).toBe('vibrational-band');
  });
});

/**
 * Observed emission of a 1 cm right-angle cell, excitation along x, emission collected from the
 * slice 0.45–0.55 cm around the centre and leaving through 0.5 cm of solution: numerical
 * integration of Beer–Lambert (independent of the engine's closed form):
 *   F ∝ Φ · ∫ 10^(−A_ex·x) · ln10·A_dots dx / 0.1 · 10^(−A_em/2)
 */
function observedEmission(phi: number, aEx: number, aDots: number, aEm: number): number {
  let sum = 0;
  const m = 1000;
  for (let j = 0; j < m; j++) {
    const x = 0.45 + (0.1 * (j + 0.5)) / m;
    sum += 10 ** (-aEx * x) * Math.LN10 * aDots * (0.1 / m);
  }
  return (phi * sum * 10 ** (-aEm / 2)) / 0.1;
}

describe('7. PL per absorbed photon (one inner-filter model; Lakowicz 2006 §2.12) and dark level', () => {
  const area = 2000;
  const pr = plSpectrum({ e: 2.1, sigma: 0.05, area, noise: 0.5, seed: 70, laserNm: 400 });
  const aDots = 0.05;
  const refF = observedEmission(1, aDots, aDots, 0.02);
  it('a real quench (Φ halved) with a titrant that absorbs 0.05 at the excitation: quench 0.50 ± 0.03', () => {
    const F = observedEmission(0.5, aDots + 0.05, aDots, 0.02);
    const s = plSpectrum({ e: 2.1, sigma: 0.05, area: (area * F) / refF, noise: 0.5, seed: 71, laserNm: 400 });
    const r = analyzeSpectrum(s, {
      reference: pr,
      excitationNm: 400,
      sampleAbsorbanceAtExcitation: aDots + 0.05,
      sampleDotsAbsorbanceAtExcitation: aDots,
      sampleAbsorbanceAtEmission: 0.02,
      referenceAbsorbanceAtExcitation: aDots,
      referenceAbsorbanceAtEmission: 0.02,
    });
    expect(Math.abs(flag(r, 'pl-quench')!.fraction! - 0.5)).toBeLessThan(0.03);
    expect(flag(r, 'pl-quench')!.message).toMatch(/per absorbed photon/);
  });
  it('the opposite: the titrant absorbs but Φ is unchanged: no quench once corrected', () => {
    const F = observedEmission(1, aDots + 0.05, aDots, 0.02);
    const s = plSpectrum({ e: 2.1, sigma: 0.05, area: (area * F) / refF, noise: 0.5, seed: 72, laserNm: 400 });
    const base = { reference: pr, excitationNm: 400 };
    // uncorrected, the inner filter of the titrant reads as a drop of 1 − F/F_ref
    expect(1 - F / refF).toBeGreaterThan(0.04);
    const r = analyzeSpectrum(s, {
      ...base,
      sampleAbsorbanceAtExcitation: aDots + 0.05,
      sampleDotsAbsorbanceAtExcitation: aDots,
      sampleAbsorbanceAtEmission: 0.02,
      referenceAbsorbanceAtExcitation: aDots,
      referenceAbsorbanceAtEmission: 0.02,
    });
    expect(flag(r, 'pl-quench')).toBeUndefined();
  });
  it('a 0.7× dilution without absorbances says "emission down … (not corrected for absorbance)"; with them, nothing', () => {
    const F = observedEmission(1, 0.7 * aDots, 0.7 * aDots, 0.7 * 0.02);
    const s = plSpectrum({ e: 2.1, sigma: 0.05, area: (area * F) / refF, noise: 0.5, seed: 73, laserNm: 400 });
    const plain = analyzeSpectrum(s, { reference: pr, excitationNm: 400 });
    expect(flag(plain, 'pl-quench')!.message).toMatch(/^emission down .* \(not corrected for absorbance\)$/);
    const corrected = analyzeSpectrum(s, {
      reference: pr,
      excitationNm: 400,
      sampleAbsorbanceAtExcitation: 0.7 * aDots,
      sampleAbsorbanceAtEmission: 0.7 * 0.02,
      referenceAbsorbanceAtExcitation: aDots,
      referenceAbsorbanceAtEmission: 0.02,
    });
    expect(corrected.flags).toEqual([]);
  });
  it('absorbances above 0.3 are refused with the reason (DOMAIN.md §4, from memory)', () => {
    const r = analyzeSpectrum(plSpectrum({ e: 2.1, sigma: 0.05, area: 1000, noise: 0.5, seed: 74, laserNm: 400 }), {
      reference: pr,
      excitationNm: 400,
      sampleAbsorbanceAtExcitation: 0.45,
      referenceAbsorbanceAtExcitation: 0.05,
    });
    expect(flag(r, 'pl-quench')!.message).toMatch(/not corrected for absorbance: sample: absorbance 0\.450 is above 0\.3/);
  });
  it('a dark level of 1 % of the peak (counts per nm) on the sample only is subtracted: no quench', () => {
    const s = plSpectrum({ e: 2.1, sigma: 0.05, area, noise: 0.5, seed: 75, laserNm: 400 });
    let peak = 0;
    for (const v of pr.y) peak = Math.max(peak, v);
    // the 400 nm laser line (50 counts) is below the emission peak here
    const dark = plus(s, () => 0.01 * peak);
    const r = analyzeSpectrum(dark, { reference: pr, excitationNm: 400 });
    expect(r.flags).toEqual([]);
    expect(Math.abs(r.parameters.darkLevel.sample! - 0.01 * peak) / (0.01 * peak)).toBeLessThan(0.05);
  });
  it('the opposite: a real 40 % quench on top of that dark level reads 0.40 ± 0.02', () => {
    let peak = 0;
    for (const v of pr.y) peak = Math.max(peak, v);
    const s = plus(plSpectrum({ e: 2.1, sigma: 0.05, area: 0.6 * area, noise: 0.5, seed: 76, laserNm: 400 }), () => 0.01 * peak);
    const r = analyzeSpectrum(s, { reference: pr, excitationNm: 400 });
    expect(kinds(r)).toEqual(['pl-quench']);
    expect(Math.abs(r.flags[0]!.fraction! - 0.4)).toBeLessThan(0.02);
  });
});

describe('5. windows follow the band: shift ±1 meV and broadening ±0.03 from 25 to 150 meV FWHM', () => {
  const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);
  for (const fwhm of [25, 50, 100, 150]) {
    const sigma = fwhm / 1000 / FWHM_PER_SIGMA;
    // SNR ≈ 500 at the emission top: noise 0.5·peak/500 with the peak of I(λ) from the generator
    const area = 100 * fwhm;
    const peakNm = HC / 2.1;
    const peak = ((area / (sigma * Math.sqrt(2 * Math.PI))) * HC) / (peakNm * peakNm);
    const nz = peak / 500;
    const r0 = plSpectrum({ e: 2.1, sigma, area, noise: nz, seed: 80 + fwhm });
    it(`${fwhm} meV emission line red-shifted by 5 meV: shift −5 ± 1 meV and no new band`, () => {
      const r = analyzeSpectrum(plSpectrum({ e: 2.095, sigma, area, noise: nz, seed: 81 + fwhm }), { reference: r0 });
      expect(kinds(r)).toEqual(['shift']);
      expect(Math.abs(r.flags[0]!.shiftMeV! + 5)).toBeLessThan(1);
    });
    // +15 %: above the 10 % flag threshold with room for the ±3 % tolerance
    it(`${fwhm} meV emission line broadened by 15 % (area kept): broadening 0.15 ± 0.03`, () => {
      const r = analyzeSpectrum(plSpectrum({ e: 2.1, sigma: sigma * 1.15, area, noise: nz, seed: 82 + fwhm }), { reference: r0 });
      const b = flag(r, 'broadening');
      expect(b).toBeDefined();
      expect(Math.abs(b!.fraction! - 0.15)).toBeLessThan(0.03);
      expect(flag(r, 'new-band')).toBeUndefined();
    });
  }
});

describe('6. first exciton: width from its low-energy half, dispersion, both CdSe models, edge and solvent warnings', () => {
  // band 1: FWHM 141 meV (σ 60 meV) at 2.2 eV, with the next transitions overlapping its high side
  const bands: Band[] = [
    { e: 2.2, sigma: 0.06, a: 0.5 },
    { e: 2.4, sigma: 0.07, a: 0.4 },
    { e: 2.9, sigma: 0.15, a: 0.6 },
  ];
  const s = absorbanceSpectrum({ bands, noise: 0.001, seed: 90, background: 0 });
  it('FWHM = 2·HWHM_low within 5 % of the true 141 meV (not the half-prominence width)', () => {
    const r = analyzeSpectrum(s, { material: 'CdSe', pathLengthCm: 1 });
    expect(Math.abs(r.firstExciton!.fwhmMeV! - 141.3) / 141.3).toBeLessThan(0.05);
  });
  it('size dispersion σ_D/D = σ_E/|dE/dD|/D from the Yu 2003 curve, within 10 % (DOMAIN.md §3)', () => {
    const r = analyzeSpectrum(s, { material: 'CdSe', pathLengthCm: 1 });
    const yu = (l: number) => 1.6122e-9 * l ** 4 - 2.6575e-6 * l ** 3 + 1.6242e-3 * l ** 2 - 0.4277 * l + 41.57;
    const l = HC / 2.2;
    const dEdD = (HC / (l + 0.01) - HC / (l - 0.01)) / (yu(l + 0.01) - yu(l - 0.01));
    const truth = 0.06 / Math.abs(dEdD) / yu(l);
    expect(Math.abs(r.derived.sizeDispersion!.relative - truth) / truth).toBeLessThan(0.1);
  });
  it('Jasieniak ε is scaled with the true HWHM (0.060 eV / 0.0706 eV), within 6 %', () => {
    const r = analyzeSpectrum(s, { material: 'CdSe', sizingModel: 'jasieniak2009', pathLengthCm: 1 });
    const truth = (155507 + 6.67054e13 * Math.exp(-2.2 / 0.10551)) * (0.06 / (0.06 * Math.sqrt(2 * Math.LN2)));
    expect(Math.abs(r.derived.extinctionPerMPerCm! - truth) / truth).toBeLessThan(0.06);
    expect(r.derived.alternativeSizing).not.toBeNull();
  });
  it('the next transitions and the first-exciton peak-to-valley ratio (noise-free model, ±3 %)', () => {
    const r = analyzeSpectrum(s, {});
    expect(r.derived.higherTransitions.length).toBeGreaterThan(0);
    expect(Math.abs(r.derived.higherTransitions[0]!.energyEv - 2.4)).toBeLessThan(0.03);
    const model = (e: number) => parentAt(e, bands, 0);
    let valley = Infinity;
    for (let e = 2.2; e <= 2.4; e += 0.0005) valley = Math.min(valley, model(e));
    const truth = model(2.2) / valley;
    expect(Math.abs(r.derived.firstExcitonPeakToValley! - truth) / truth).toBeLessThan(0.03);
  });
  it('a first exciton cut by the red end of the data is warned about', () => {
    const cut = absorbanceSpectrum({ bands, noise: 0.001, seed: 91, background: 0, nmFrom: HC / 2.21, nmTo: 350, points: 500 });
    const r = analyzeSpectrum(cut, {});
    expect(r.warnings.some((w) => /red end of the data/.test(w))).toBe(true);
    expect(analyzeSpectrum(s, {}).warnings.some((w) => /red end of the data/.test(w))).toBe(false);
  });
});

describe('8. bleach net of shift', () => {
  it('a 10 % bleach plus a 10 meV red shift: bleach of the band 0.098 ± 0.015 and shift −10 ± 1 meV', () => {
    const s = absorbanceSpectrum({
      bands: PARENT_BANDS.map((b, i) => (i === 0 ? { ...b, a: b.a * 0.9, e: b.e - 0.01 } : b)),
      noise,
      seed: 95,
    });
    const r = analyzeSpectrum(s, { reference: ref });
    expect(Math.abs(flag(r, 'bleach')!.fraction! - (0.1 * 0.5) / A1)).toBeLessThan(0.015);
    expect(Math.abs(flag(r, 'shift')!.shiftMeV! + 10)).toBeLessThan(1);
  });
});

describe('9. words by technique', () => {
  it('absorption peaks are excitonic transitions, PL emission bands, IR vibrational bands', () => {
    expect(analyzeSpectrum(ref).peaks.every((p) => p.bandRole === 'excitonic-transition')).toBe(true);
    expect(
      analyzeSpectrum(plSpectrum({ e: 2.1, sigma: 0.05, area: 2000, noise: 0.5, seed: 96 })).peaks.every(
        (p) => p.bandRole === 'emission-band',
      ),
    ).toBe(true);
    expect(analyzeSpectrum(midIr(97)).peaks.every((p) => p.bandRole === 'vibrational-band')).toBe(true);
  });
});

describe('noise only at SNR 20: no flags in at least 95 of 100 pairs (common practice)', () => {
  it('absorption', () => {
    // SNR 20: noise σ = max(absorbance)/20 of the noise-free parent
    let top = 0;
    for (let nm = 350; nm <= 750; nm += 0.5) top = Math.max(top, parentAt(HC / nm));
    const sigma = top / 20;
    const parent = absorbanceSpectrum({ bands: PARENT_BANDS, noise: sigma, seed: 1000 });
    let flagged = 0;
    for (let k = 0; k < 100; k++)
      if (analyzeSpectrum(absorbanceSpectrum({ bands: PARENT_BANDS, noise: sigma, seed: 1001 + k }), { reference: parent }).flags.length)
        flagged++;
    expect(flagged).toBeLessThanOrEqual(5);
  });
  it('PL', () => {
    const peak = ((2000 / (0.05 * Math.sqrt(2 * Math.PI))) * HC) / (HC / 2.1) ** 2;
    const parent = plSpectrum({ e: 2.1, sigma: 0.05, area: 2000, noise: peak / 20, seed: 2000 });
    let flagged = 0;
    for (let k = 0; k < 100; k++)
      if (
        analyzeSpectrum(plSpectrum({ e: 2.1, sigma: 0.05, area: 2000, noise: peak / 20, seed: 2001 + k }), { reference: parent }).flags
          .length
      )
        flagged++;
    expect(flagged).toBeLessThanOrEqual(5);
  });
});
