import { CM1_PER_EV } from '../constants';

/**
 * Atmospheric absorption that shows up in mid-IR spectra whenever the purge differs between the
 * background and the sample (common practice; positions from memory, DOMAIN.md "Comparing a
 * sample with its parent"): CO₂ asymmetric stretch near 2350 cm⁻¹ (P and R branches at ~2340 and
 * ~2360) and bend near 667 cm⁻¹; water-vapour rotation–vibration lines at roughly 1300–1900 and
 * 3500–3900 cm⁻¹. CO₂ ranges are always masked; water-vapour ranges only when their narrow lines
 * are seen in the difference (they overlap where intraband bands of n-doped dots lie).
 */
export interface AtmosphericBand {
  name: string;
  fromCm1: number;
  toCm1: number;
  /** 'envelope': one residue masked across the whole range; 'lines': a series of narrow lines. */
  shape: 'envelope' | 'lines';
}

export const ATMOSPHERIC_BANDS: readonly AtmosphericBand[] = [
  { name: 'CO₂ bend', fromCm1: 640, toCm1: 690, shape: 'envelope' },
  { name: 'water-vapour lines (bend)', fromCm1: 1300, toCm1: 1900, shape: 'lines' },
  { name: 'CO₂ asymmetric stretch', fromCm1: 2280, toCm1: 2400, shape: 'envelope' },
  { name: 'water-vapour lines (stretch)', fromCm1: 3500, toCm1: 3900, shape: 'lines' },
];

export interface AtmosphericBandReport {
  name: string;
  fromCm1: number;
  toCm1: number;
  /** Whether a residue of it was seen in the difference sample − reference. */
  present: boolean;
  /** Whether new-band and band-change detection ignored it. */
  masked: boolean;
}

/** Half width of the running median that removes water-vapour lines, cm⁻¹ (lines are a few cm⁻¹ wide; common practice). */
const LINE_MEDIAN_HALF_WIDTH_CM1 = 30;

/**
 * Finds the atmospheric bands inside an energy grid and masks them in `excess` (the unexplained
 * difference on grid indices [offset, offset + excess.length)), in place: an envelope range is
 * replaced by the straight line between the medians of 5 points just outside it; a line range, when
 * lines are present, by its running median over ±30 cm⁻¹ (narrow lines removed, a broad band kept).
 * `rawDifference` is the unsmoothed sample − reference on the whole grid and `sigmaRaw` its noise σ;
 * `smoothedDifference` its smoothed version with noise σ `sigmaSmoothed`.
 */
export function atmosphericBandsInRange(
  energy: Float64Array,
  excess: Float64Array,
  offset: number,
  rawDifference: Float64Array,
  smoothedDifference: Float64Array,
  sigmaRaw: number,
  sigmaSmoothed: number,
  minSignificance: number,
): AtmosphericBandReport[] {
  const n = energy.length;
  const step = (energy[n - 1]! - energy[0]!) / (n - 1);
  const index = (cm1: number) => Math.round((cm1 / CM1_PER_EV - energy[0]!) / step);
  const out: AtmosphericBandReport[] = [];
  for (const band of ATMOSPHERIC_BANDS) {
    const a = Math.max(index(band.fromCm1), 0);
    const b = Math.min(index(band.toCm1), n - 1);
    if (b - a < 3) continue;
    if (band.shape === 'envelope') {
      let worst = 0;
      for (let i = a; i <= b; i++) worst = Math.max(worst, Math.abs(smoothedDifference[i]!));
      const present = worst >= minSignificance * sigmaSmoothed;
      maskEnvelope(excess, a - offset, b - offset);
      out.push({ name: band.name, fromCm1: band.fromCm1, toCm1: band.toCm1, present, masked: true });
    } else {
      // narrow lines: the part of the raw difference that a ±half-width running median does not follow
      const h = Math.max(2, Math.round(LINE_MEDIAN_HALF_WIDTH_CM1 / CM1_PER_EV / step));
      const base = runningMedian(rawDifference, a, b, h);
      let spikes = 0;
      for (let i = a; i <= b; i++) if (Math.abs(rawDifference[i]! - base[i - a]!) > minSignificance * sigmaRaw) spikes++;
      // white noise passes 5σ about once in 1.7 million points: three such points are lines
      const present = spikes >= 3;
      if (present) {
        const lo = Math.max(a - offset, 0);
        const hi = Math.min(b - offset, excess.length - 1);
        if (hi > lo) {
          const med = runningMedian(excess, lo, hi, h);
          excess.set(med, lo);
        }
      }
      out.push({ name: band.name, fromCm1: band.fromCm1, toCm1: band.toCm1, present, masked: present });
    }
  }
  return out;
}

function maskEnvelope(excess: Float64Array, a: number, b: number): void {
  const m = excess.length;
  if (b < 0 || a >= m) return;
  const edge = (from: number, to: number) => {
    const v: number[] = [];
    for (let i = Math.max(from, 0); i <= Math.min(to, m - 1); i++) v.push(excess[i]!);
    v.sort((x, y) => x - y);
    return v.length ? v[Math.floor(v.length / 2)]! : null;
  };
  const left = edge(a - 5, a - 1);
  const right = edge(b + 1, b + 5);
  const l = left ?? right ?? 0;
  const r = right ?? left ?? 0;
  const lo = Math.max(a, 0);
  const hi = Math.min(b, m - 1);
  for (let i = lo; i <= hi; i++) excess[i] = l + ((r - l) * (i - a + 1)) / (b - a + 2);
}

/** Running median of y[a..b] over ±h points (clipped to [a, b]). O((b−a)·h log h): used on small ranges only. */
function runningMedian(y: Float64Array, a: number, b: number, h: number): Float64Array {
  const out = new Float64Array(b - a + 1);
  const buf: number[] = [];
  for (let i = a; i <= b; i++) {
    buf.length = 0;
    for (let j = Math.max(a, i - h); j <= Math.min(b, i + h); j++) buf.push(y[j]!);
    buf.sort((x, z) => x - z);
    out[i - a] = buf[Math.floor(buf.length / 2)]!;
  }
  return out;
}
