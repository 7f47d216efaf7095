import { median } from './estimateNoise';

/**
 * Baseline for absorbance in the transparent region below the gap (energies < `belowEv`):
 * 'offset' — the median there; 'scatter' — a least-squares fit of a + b·E⁴ (Rayleigh-like
 * scattering ∝ λ⁻⁴; common practice). Returns the baseline evaluated on the whole axis, or null
 * when fewer than 8 points lie in the transparent region. Inputs are not modified.
 */
export function fitBaseline(
  energy: ArrayLike<number>,
  signal: ArrayLike<number>,
  belowEv: number,
  mode: 'offset' | 'scatter',
): Float64Array | null {
  const n = energy.length;
  // energies ascend on the grid, but do not rely on it: collect indices below the cut
  const idx = new Int32Array(n);
  let count = 0;
  for (let i = 0; i < n; i++) if (energy[i]! < belowEv) idx[count++] = i;
  if (count < 8) return null;
  const out = new Float64Array(n);
  if (mode === 'offset') {
    const v = new Float64Array(count);
    for (let k = 0; k < count; k++) v[k] = signal[idx[k]!]!;
    out.fill(median(v));
    return out;
  }
  // scatter: a + b E^4 by linear least squares
  let s1 = 0,
    sx = 0,
    sxx = 0,
    sy = 0,
    sxy = 0;
  for (let k = 0; k < count; k++) {
    const i = idx[k]!;
    const u = energy[i]! ** 4;
    s1 += 1;
    sx += u;
    sxx += u * u;
    sy += signal[i]!;
    sxy += u * signal[i]!;
  }
  const det = s1 * sxx - sx * sx;
  const b = det !== 0 ? (s1 * sxy - sx * sy) / det : 0;
  const a = (sy - b * sx) / s1;
  for (let i = 0; i < n; i++) out[i] = a + b * energy[i]! ** 4;
  return out;
}
