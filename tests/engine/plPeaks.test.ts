import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyzeSpectrum, parseSpectrumFile, type ParsedSpectrum } from '../../lib/engine/index';
import { makeUniform, poissonDraw, HC } from './synthetic';
import { realDir, scipy } from './scipy';

// Emission peaks of real and synthetic photoluminescence spectra (engine 1.4.0: the significance
// of a peak is measured against the noise around it, and emission features below 1 % of the main
// band are not reported). The engine reports maxima of I(E) = I(λ)·λ²/hc on an energy axis
// (DOMAIN.md §4); that maximum lies to the red of the maximum of the counts as recorded.

const read = (f: string) => new Uint8Array(readFileSync(path.join(realDir, f)));
type PlMax = { argmaxNm: number; argmaxEnergyAxisNm: number; tailSigma: number; smoothed: number[] };

/** scipy savgol_filter (21 points ≈ 9 nm, quadratic) on the parsed wavelength array. */
function scipyPlMax(s: ParsedSpectrum): PlMax {
  return scipy<PlMax>({
    op: 'pl_max',
    x: Array.from(s.x),
    y: Array.from(s.y),
    window: 21,
    poly: 2,
    // excitation line at 365 nm (PROVENANCE.md) and the rise below it
    exclude_lo: 355,
    exclude_hi: 385,
    min_nm: 385,
    // flat red tail: noise only (PROVENANCE.md files end at 1108 nm; scipy smoothed counts there ≈ dark level)
    tail_lo: 850,
    tail_hi: 1100,
  });
}

function smoothedAt(s: ParsedSpectrum, ref: PlMax, nm: number): number {
  let best = 0;
  for (let i = 1; i < s.x.length; i++) if (Math.abs(s.x[i]! - nm) < Math.abs(s.x[best]! - nm)) best = i;
  return ref.smoothed[best]!;
}

const cases: Array<{ file: string; provenanceNm: number }> = [
  // emission maxima stated in real-spectra/PROVENANCE.md
  { file: 'carbon-dots-pl-ex365-weak-with-scatter.txt', provenanceNm: 526 },
  { file: 'carbon-dots-pl-ex365-decimal-comma.txt', provenanceNm: 449 },
  { file: 'quinine-sulfate-pl-ex365-decimal-comma.txt', provenanceNm: 461 },
];

describe('real PL spectra: emission peaks, none in the noisy red tail', () => {
  for (const { file, provenanceNm } of cases) {
    describe(file, () => {
      let s: ParsedSpectrum;
      let ref: PlMax;
      let report: ReturnType<typeof analyzeSpectrum>;
      beforeAll(() => {
        s = parseSpectrumFile(file, read(file));
        ref = scipyPlMax(s);
        report = analyzeSpectrum(s, { technique: 'pl' });
      });
      it('scipy reference agrees with PROVENANCE.md on the recorded maximum (within 3 nm)', () => {
        expect(Math.abs(ref.argmaxNm - provenanceNm)).toBeLessThan(3);
      });
      it('one or two emission maxima; the strongest within 3 nm of scipy’s smoothed argmax of counts·λ² outside 355–385 nm', () => {
        expect(report.parameters.excitationNm).toBe(365); // from the file name (PROVENANCE.md: excitation 365 nm)
        const maxima = report.peaks.filter((p) => p.kind === 'maximum');
        expect(report.peaks.length).toBeGreaterThanOrEqual(1);
        expect(report.peaks.length).toBeLessThanOrEqual(2); // PROVENANCE.md: one emission band per file
        expect(report.firstExciton).not.toBeNull();
        expect(maxima).toContainEqual(report.firstExciton);
        // scipy: argmax of savgol_filter(y)·λ², the energy-axis spectrum the engine analyses
        expect(Math.abs(report.firstExciton!.wavelengthNm - ref.argmaxEnergyAxisNm)).toBeLessThan(3);
        // the λ² Jacobian moves a broad band's maximum to the red of the recorded one (DOMAIN.md §4),
        // by less than 15 nm for these bands (scipy: 6.3–11.6 nm with this smoothing)
        const redShift = report.firstExciton!.wavelengthNm - ref.argmaxNm;
        expect(redShift).toBeGreaterThan(0);
        expect(redShift).toBeLessThan(15);
      });
      it('every reported feature stands ≥ 5 σ above the dark level (scipy smoothed counts vs the tail’s residual σ)', () => {
        for (const p of report.peaks) {
          expect(p.wavelengthNm).toBeGreaterThan(385); // outside the excitation region
          expect(smoothedAt(s, ref, p.wavelengthNm)).toBeGreaterThan(5 * ref.tailSigma);
        }
      });
    });
  }
});

describe('synthetic Poisson-noise PL spectrum (seeded generator, known truth)', () => {
  // Gaussian band in energy (centre 2.25 eV = 551.04 nm, σ 0.06 eV) recorded as counts per 0.45 nm
  // pixel from 380 to 1100 nm (I(λ) = I(E)·hc/λ²), plus a constant dark level; counts are Poisson.
  const centreEv = 2.25;
  const x = Float64Array.from({ length: 1601 }, (_, i) => 380 + 0.45 * i);
  const make = (seed: number, peakCounts: number, dark: number): ParsedSpectrum => {
    const u = makeUniform(seed);
    const lc = HC / centreEv;
    const y = x.map((nm) => poissonDraw(dark + peakCounts * (lc / nm) ** 2 * Math.exp(-0.5 * ((HC / nm - centreEv) / 0.06) ** 2), u));
    return {
      fileName: `poisson-${seed}.txt`,
      format: 'delimited',
      x,
      y,
      xUnit: 'nm',
      yUnit: 'counts',
      xOrderInFile: 'ascending',
      technique: 'pl',
      columnName: 'counts',
      columnIndex: 1,
      availableColumns: ['counts'],
      metadata: {},
      warnings: [],
    };
  };
  // tolerance: the argmax of a smoothed broad band scatters with the noise (a 12-seed run of this
  // generator while writing the test: ≤ 0.9 nm at 2000 counts, ≤ 4 nm at 300 counts)
  for (const [seed, peakCounts, dark, tolNm] of [
    [1, 2000, 10, 2],
    [2, 2000, 10, 2],
    [3, 2000, 10, 2],
    [4, 300, 20, 5],
    [5, 300, 20, 5],
  ] as const) {
    it(`seed ${seed}, ${peakCounts} counts on a dark level of ${dark}: exactly one peak, within ${tolNm} nm of the true centre`, () => {
      const r = analyzeSpectrum(make(seed, peakCounts, dark), { technique: 'pl' });
      expect(r.peaks).toHaveLength(1);
      // generator truth: 551.04 nm; the dark level's λ² ramp moves the energy-axis maximum by
      // δE ≈ 2·dark·σ²/(A·E₀) ≤ 0.3 nm here (analytic, first order)
      expect(Math.abs(r.peaks[0]!.wavelengthNm - HC / centreEv)).toBeLessThan(tolNm);
    });
  }
});
