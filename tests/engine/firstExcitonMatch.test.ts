import { describe, expect, it } from 'vitest';
import { analyzeSpectrum, parseSpectrumFile } from '@/lib/engine';
import { matchFirstExciton } from '@/lib/engine/peaks/matchFirstExciton';
import type { ExcitonicPeak } from '@/lib/engine/peaks/findExcitonicPeaks';
import { absorptionCsv } from '@/lib/demo/synthetic';

// Source of every expected value: the known truth of the demo generator (lib/demo/synthetic.ts);
// the ±0.15 eV matching window is common practice (see lib/engine/peaks/matchFirstExciton.ts).

const parse = (name: string, text: string) => parseSpectrumFile(name, new TextEncoder().encode(text));

describe('first exciton of a charged sample', () => {
  it('is the feature at the parent first-exciton energy, not a new band below the gap (known truth of the generator)', () => {
    // Generator truth: parent first exciton at 2.148 eV; the charged sample keeps it
    // (bleached by 40 %) and gains a new band at 1.72 eV.
    const reference = parse('parent.csv', absorptionCsv({ firstExcitonEv: 2.148, seed: 5 }, 'parent'));
    const sample = parse(
      'charged.csv',
      absorptionCsv({ firstExcitonEv: 2.148, bleach: 0.4, newBand: { centreEv: 1.72, height: 0.05, sigmaEv: 0.08 }, seed: 6 }, 'charged'),
    );
    const alone = analyzeSpectrum(sample, { technique: 'absorption' });
    expect(alone.firstExciton!.energyEv).toBeLessThan(1.8); // without a parent the lowest feature is taken
    const report = analyzeSpectrum(sample, { technique: 'absorption', reference });
    expect(report.firstExciton!.energyEv).toBeCloseTo(2.148, 1);
    expect(report.flags.some((f) => f.kind === 'new-band' && Math.abs((f.energyEv ?? 0) - 1.72) < 0.03)).toBe(true);
    expect(report.warnings.join(' ')).toMatch(/first exciton taken at 2\.1/);
  });

  it('picks the nearest feature inside the window and nothing outside it', () => {
    const peak = (energyEv: number) => ({ energyEv }) as ExcitonicPeak;
    const peaks = [peak(1.7), peak(2.13), peak(2.2)];
    expect(matchFirstExciton(peaks, 2.148)?.energyEv).toBe(2.13);
    expect(matchFirstExciton(peaks, 2.5)).toBeNull();
    expect(() => matchFirstExciton(peaks, 2.1, 0)).toThrow(RangeError);
  });
});

describe('a broad new band near the end of the range', () => {
  it('is flagged whatever the smoothing window (known truth of the generator: band at 1.72 eV, 0.067 eV from the 750 nm end)', () => {
    const reference = parse('parent.csv', absorptionCsv({ firstExcitonEv: 2.148, seed: 11 }, 'parent'));
    const sample = parse(
      'charged.csv',
      absorptionCsv({ firstExcitonEv: 2.148, bleach: 0.42, newBand: { centreEv: 1.72, height: 0.05, sigmaEv: 0.08 }, seed: 12 }, 'charged'),
    );
    for (const smoothingWindow of [13, 23, 31]) {
      const report = analyzeSpectrum(sample, { technique: 'absorption', reference, smoothingWindow });
      const bands = report.flags.filter((f) => f.kind === 'new-band');
      expect(bands.length, `window ${smoothingWindow}`).toBe(1);
      expect(Math.abs(bands[0]!.energyEv! - 1.72), `window ${smoothingWindow}`).toBeLessThan(0.03);
    }
  });
});
