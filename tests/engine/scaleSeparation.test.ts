import { describe, expect, it } from 'vitest';
import { analyzeSpectrum, type AnalysisReport, type ParsedSpectrum } from '@/lib/engine/index';
import { cdseLikeAbsorbance, gaussianNoise } from '@/lib/demo/synthetic';
import { fitConcentration, MAX_SCALE_INFLATION } from '@/lib/engine/compare/fitConcentration';

// Concentration against smooth background when the band-free regions are short or curved. Truth
// comes from the noise-free generator: the demo scenario's CdSe-like model (lib/demo/synthetic.ts:
// excitonic Gaussians on a sigmoid continuum), sampled like the demo (400–750 nm, 0.5 nm) and over a
// wide range (300–900 nm, 1 nm), scaled by k, with an optional smooth background and noise.
const HC = 1239.841984; // eV·nm, CODATA 2018
const E1 = 2.148; // the demo parent's first exciton (scripts/seed.ts)

interface Pair {
  k: number;
  bleach?: number;
  /** Background added to the sample: offset + slope·(E − 1.65 eV), absorbance and A/eV. */
  offset?: number;
  slope?: number;
  noise: number;
  seed: number;
  nm: [number, number, number];
  firstExcitonEv?: number;
}

const DEMO: [number, number, number] = [400, 750, 0.5];
const WIDE: [number, number, number] = [300, 900, 1];

function spectrum(
  name: string,
  p: {
    scale: number;
    bleach: number;
    offset: number;
    slope: number;
    noise: number;
    seed: number;
    nm: [number, number, number];
    fx: number;
  },
): ParsedSpectrum {
  const [from, to, step] = p.nm;
  const n = Math.round((to - from) / step) + 1;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  const rng = gaussianNoise(p.seed);
  for (let i = 0; i < n; i++) {
    const nm = from + i * step;
    const e = HC / nm;
    x[i] = nm;
    y[i] = p.scale * cdseLikeAbsorbance(e, { firstExcitonEv: p.fx, bleach: p.bleach }) + p.offset + p.slope * (e - 1.65) + p.noise * rng();
  }
  return {
    fileName: name,
    format: 'delimited',
    x,
    y,
    xUnit: 'nm',
    yUnit: 'absorbance',
    xOrderInFile: 'ascending',
    technique: 'absorption',
    columnName: 'A',
    columnIndex: 1,
    availableColumns: ['A'],
    metadata: {},
    warnings: [],
  };
}

function analysePair(p: Pair): AnalysisReport {
  const fx = p.firstExcitonEv ?? E1;
  const reference = spectrum('parent.csv', { scale: 1, bleach: 0, offset: 0, slope: 0, noise: p.noise, seed: p.seed, nm: p.nm, fx });
  const sample = spectrum('sample.csv', {
    scale: p.k,
    bleach: p.bleach ?? 0,
    offset: p.offset ?? 0,
    slope: p.slope ?? 0,
    noise: p.noise,
    seed: p.seed + 1000,
    nm: p.nm,
    fx,
  });
  return analyzeSpectrum(sample, { reference });
}

/** Bleach of the noise-free model at the first exciton: the fractional drop of A(E1), scale removed. */
function trueBleach(bleach: number, fx = E1): number {
  const a0 = cdseLikeAbsorbance(fx, { firstExcitonEv: fx });
  return (a0 - cdseLikeAbsorbance(fx, { firstExcitonEv: fx, bleach })) / a0;
}

const kinds = (r: AnalysisReport) => r.flags.map((f) => f.kind);

// Tolerances. Ratio: ±0.02 absolute (≈ 3× the standard uncertainty the fit has on these data at
// the demo's noise, σ = 0.0015 A on ~700 points; the noise-free cases must be far closer). Bleach:
// ±0.025 absolute on a 19.4 % true bleach: the bleach is read at the engine's first-exciton maximum,
// within a few meV of E1, where the fraction of a 45 meV Gaussian on a continuum < 3 % of A varies
// by < 0.003; the smoothed noise gives ≈ 0.002 and the ratio's relative uncertainty (≤ 1 %) ≈ 0.008;
// 0.025 is about 3× their sum in quadrature (common practice for a test bound).
const RATIO_TOL = 0.02;
const BLEACH_TOL = 0.025;

describe.each([
  ['demo-like 400–750 nm, 0.5 nm', DEMO],
  ['wide range 300–900 nm, 1 nm', WIDE],
] as const)('auto normalisation on %s spectra', (_label, nm) => {
  for (const noise of [0, 0.0015]) {
    const tag = noise === 0 ? 'noise-free' : 'σ = 0.0015';
    for (const k of [0.5, 0.7]) {
      it(`${tag}: a pure ${k}× dilution is a concentration ratio ${k}, no bleach, no new band`, () => {
        const r = analysePair({ k, noise, seed: 3, nm });
        const d = r.parameters.normalization.details;
        expect(d.applied).toBe('fit');
        expect(d.scaleDetermined).toBe(true);
        expect(Math.abs(d.concentrationRatio - k)).toBeLessThan(noise === 0 ? 0.005 : RATIO_TOL);
        expect(d.separation!.scaleInflation).toBeLessThanOrEqual(MAX_SCALE_INFLATION);
        expect(kinds(r)).toEqual(['concentration']);
        expect(r.flags[0]!.magnitude).toBeCloseTo(d.concentrationRatio, 12);
      });
      it(`${tag}: a ${k}× dilution with a 20 % first-exciton bleach reads the bleach of the model`, () => {
        const r = analysePair({ k, bleach: 0.2, noise, seed: 4, nm });
        const truth = trueBleach(0.2);
        expect(truth).toBeGreaterThan(0.19); // the model's own 20 % on a small continuum share
        const b = r.flags.find((f) => f.kind === 'bleach');
        expect(b, JSON.stringify(r.flags)).toBeDefined();
        expect(Math.abs(b!.fraction! - truth)).toBeLessThan(BLEACH_TOL);
        expect(Math.abs(r.parameters.normalization.details.concentrationRatio - k)).toBeLessThan(RATIO_TOL);
        expect(kinds(r)).not.toContain('new-band');
      });
    }
    it(`${tag}: a 0.7× dilution on a sloping baseline (0.01 A + 0.05 A/eV) is no bleach and no new band`, () => {
      const r = analysePair({ k: 0.7, offset: 0.01, slope: 0.05, noise, seed: 5, nm });
      const d = r.parameters.normalization.details;
      expect(d.applied).toBe('fit');
      expect(d.separation!.terms).toContain('slope');
      expect(Math.abs(d.concentrationRatio - 0.7)).toBeLessThan(RATIO_TOL);
      expect(kinds(r)).toEqual(['concentration']);
    });
  }
});

describe('noisy dilutions across seeds (demo-like spectra)', () => {
  it('0.5× and 0.7× dilutions without a band change raise no band flag in 20 seeds each', () => {
    const bad: string[] = [];
    for (const k of [0.5, 0.7]) {
      for (let seed = 10; seed < 30; seed++) {
        const r = analysePair({ k, noise: 0.0015, seed, nm: DEMO });
        const band = r.flags.filter((f) => f.kind !== 'concentration');
        if (band.length) bad.push(`${k}× seed ${seed}: ${band.map((f) => f.message).join('; ')}`);
      }
    }
    expect(bad).toEqual([]);
  });
});

describe('a scale the background can imitate', () => {
  // Unit level: a reference whose only band-free stretch above the gap is short and nearly linear,
  // and a sample that needs both a slope (pinned by the transparent region) and the shift term.
  const n = 600;
  const E = Float64Array.from({ length: n }, (_, i) => 1.6 + (1.6 * i) / (n - 1));
  const R = E.map((e) => 0.5 * Math.exp(-0.5 * ((e - 2.2) / 0.05) ** 2) + 0.4 / (1 + Math.exp(-(e - 3.1) / 0.12)));
  const R1 = new Float64Array(n);
  for (let i = 1; i < n - 1; i++) R1[i] = (R[i + 1]! - R[i - 1]!) / (E[i + 1]! - E[i - 1]!);
  R1[0] = R1[1]!;
  R1[n - 1] = R1[n - 2]!;
  const gap = Uint8Array.from(E, (e) => (e <= 2.0 ? 1 : 0));
  const none = new Uint8Array(n);

  it('the variance inflation of k equals 1/(1 − R²) of R regressed on the other columns (definition, computed here)', () => {
    const mask = Uint8Array.from(E, (e) => (e <= 2.0 || e >= 2.7 ? 1 : 0));
    const S = E.map((_e, i) => 0.6 * R[i]! + 0.01);
    const f = fitConcentration(E, S, R, R1, mask, {
      sigmaSample: 1e-3,
      sigmaReference: 0,
      clipWindow: 9,
      allowSlopeAndScatter: true,
      clippable: none,
    })!;
    // regress R on [1, u, R'] (the terms kept, per f.terms) by normal equations, here in plain JS
    const idx = [...mask.keys()].filter((i) => mask[i]);
    const cols: number[][] = [idx.map(() => 1)];
    if (f.terms.includes('slope')) cols.push(idx.map((i) => E[i]!));
    if (f.terms.includes('shift')) cols.push(idx.map((i) => R1[i]!));
    expect(f.terms).not.toContain('scatter');
    const y = idx.map((i) => R[i]!);
    const p = cols.length;
    const A = Array.from({ length: p }, (_, a) =>
      Array.from({ length: p }, (_, b) => cols[a]!.reduce((s, v, j) => s + v * cols[b]![j]!, 0)),
    );
    const bv = Array.from({ length: p }, (_, a) => cols[a]!.reduce((s, v, j) => s + v * y[j]!, 0));
    // Gauss–Jordan
    for (let c = 0; c < p; c++) {
      const piv = A[c]![c]!;
      for (let j = 0; j < p; j++) A[c]![j]! /= piv;
      bv[c]! /= piv;
      for (let r = 0; r < p; r++)
        if (r !== c) {
          const fct = A[r]![c]!;
          for (let j = 0; j < p; j++) A[r]![j] = A[r]![j]! - fct * A[c]![j]!;
          bv[r] = bv[r]! - fct * bv[c]!;
        }
    }
    const fitR = y.map((_v, j) => cols.reduce((s, col, a) => s + bv[a]! * col[j]!, 0));
    const mean = y.reduce((s, v) => s + v, 0) / y.length;
    const ssTot = y.reduce((s, v) => s + (v - mean) ** 2, 0);
    const ssRes = y.reduce((s, v, j) => s + (v - fitR[j]!) ** 2, 0);
    expect(f.scaleInflation).toBeCloseTo(1 / (ssRes / ssTot), 6);
  });

  it('a short, nearly straight continuum: the slope the data do not need is left out and k is right', () => {
    const mask = Uint8Array.from(E, (e) => (e <= 2.0 || e >= 3.05 ? 1 : 0));
    const S = E.map((_e, i) => 0.5 * R[i]! + 0.004);
    const f = fitConcentration(E, S, R, R1, mask, {
      sigmaSample: 1e-3,
      sigmaReference: 0,
      clipWindow: 9,
      allowSlopeAndScatter: true,
      clippable: gap,
    })!;
    expect(f.scaleInflation).toBeLessThanOrEqual(MAX_SCALE_INFLATION);
    expect(f.degenerate).toBeNull();
    expect(f.dropped.length).toBeGreaterThan(0);
    expect(f.ratio).toBeCloseTo(0.5, 6);
  });
});

describe('a ratio the background imitates and the data cannot pin: refused, said, no scale-dependent flag', () => {
  // Demo-like spectra at σ = 0.006 A (S/N ≈ 100), sample at 0.5× on a sloping baseline the
  // transparent region demands: the slope and the short curved continuum trade against k (variance
  // inflation ≈ 50), and k is then known only to ≈ ±2 %, worse than the ±1 % (minBleachFraction /
  // minSignificance) within which a 5σ trade stays below the smallest bleach flagged.
  for (const seed of [1, 2, 3]) {
    it(`seed ${seed}: auto refused with the reason; no bleach, no new band, no concentration flag`, () => {
      const r = analysePair({ k: 0.5, offset: 0.01, slope: 0.05, noise: 0.006, seed, nm: DEMO });
      const d = r.parameters.normalization.details;
      expect(d.applied).toBe('none');
      expect(d.scaleDetermined).toBe(false);
      expect(d.separation!.scaleInflation).toBeGreaterThan(MAX_SCALE_INFLATION);
      expect(d.reason).toMatch(/^not scaled: .*baseline slope.*withheld/);
      // engine 1.x compared this pair unscaled and read the 0.5× dilution as a ~50 % bleach
      expect(kinds(r).filter((k) => k === 'bleach' || k === 'new-band' || k === 'concentration')).toEqual([]);
      expect(r.warnings.join('\n')).toMatch(/bleach and new-band flags withheld/);
    });
  }
  it('the same pair with a real 0.5× dilution and 20 % bleach at the demo noise (σ = 0.0015) is scaled and reads the bleach', () => {
    const r = analysePair({ k: 0.5, bleach: 0.2, offset: 0.01, slope: 0.05, noise: 0.0015, seed: 2, nm: DEMO });
    const d = r.parameters.normalization.details;
    expect(d.applied).toBe('fit');
    expect(Math.abs(d.concentrationRatio - 0.5)).toBeLessThan(RATIO_TOL);
    const b = r.flags.find((f) => f.kind === 'bleach');
    expect(Math.abs(b!.fraction! - trueBleach(0.2))).toBeLessThan(BLEACH_TOL);
    expect(kinds(r)).not.toContain('new-band');
  });
});

describe('data that stop before the continuum: no ratio can be fitted, so no scale-dependent flag', () => {
  // 500–750 nm reaches 2.48 eV, 0.33 eV above the first exciton: less than the 0.5 eV the
  // continuum starts at (CONTINUUM_OFFSET_EV). engine 2.0 compared such a pair unscaled and read a
  // 0.7× dilution as a ~30 % bleach.
  const SHORT: [number, number, number] = [500, 750, 0.5];
  it('a pure 0.7× dilution: auto refused with the reason, no bleach and no new band', () => {
    const r = analysePair({ k: 0.7, noise: 0.0015, seed: 4, nm: SHORT });
    const d = r.parameters.normalization.details;
    expect(d.applied).toBe('none');
    expect(d.scaleDetermined).toBe(false);
    expect(d.reason).toMatch(/no continuum to scale on.*withheld/);
    expect(kinds(r).filter((k) => k === 'bleach' || k === 'new-band')).toEqual([]);
  });
  it('the same pair with a 20 % bleach and the concentrations given: scaled by them and the bleach is read', () => {
    const fx = E1;
    const reference = spectrum('parent.csv', { scale: 1, bleach: 0, offset: 0, slope: 0, noise: 0.0015, seed: 4, nm: SHORT, fx });
    const sample = spectrum('sample.csv', { scale: 0.7, bleach: 0.2, offset: 0, slope: 0, noise: 0.0015, seed: 1004, nm: SHORT, fx });
    const r = analyzeSpectrum(sample, {
      reference,
      normalization: { mode: 'concentration', sampleConcentration: 0.7, referenceConcentration: 1 },
    });
    const b = r.flags.find((f) => f.kind === 'bleach');
    expect(b).toBeDefined();
    expect(Math.abs(b!.fraction! - trueBleach(0.2))).toBeLessThan(BLEACH_TOL);
  });
});
