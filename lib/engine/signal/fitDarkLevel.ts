import { CM1_PER_EV, HC_EV_NM } from '../constants';
import type { XUnit } from '../types';

/**
 * Dark level of an emission spectrum: a constant d in the counts recorded per unit of the file's
 * X axis, which on the energy axis reads d·J(E) with J the Jacobian of the axis change (λ²/hc =
 * hc/E² for nm, hc/(1000·E²) for µm, 8065.54394 for cm⁻¹, 1 for eV, as in toEnergyAxis; Mooney & Kambhampati, J. Phys.
 * Chem. Lett. 2013, 4, 3316). Fitted by least squares, d = Σ y·J / Σ J², on the band-free ends:
 * energies more than 3 FWHM from the emission maximum (a Gaussian is below 10⁻¹¹ of its top
 * there), outside the excitation exclusion and the smoothing edge guards (common practice: the
 * dark level is read where there is no emission). Needs 16 such points.
 */
export function fitDarkLevel(
  energy: Float64Array,
  raw: Float64Array,
  smoothed: Float64Array,
  o: { exclude: Array<[number, number]>; edgeGuard: number; xUnit: XUnit },
): { level: number | null; jacobian: Float64Array; reason: string } {
  const n = energy.length;
  const jacobian = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const e = energy[i]!;
    jacobian[i] =
      o.xUnit === 'nm' ? HC_EV_NM / (e * e) : o.xUnit === 'um' ? (HC_EV_NM / (e * e)) * 1e-3 : o.xUnit === 'cm-1' ? CM1_PER_EV : 1;
  }
  const excluded = (e: number) => o.exclude.some(([lo, hi]) => e >= lo && e <= hi);
  const g = Math.max(0, Math.round(o.edgeGuard));
  let top = -1;
  for (let i = g; i < n - g; i++) if (!excluded(energy[i]!) && (top < 0 || smoothed[i]! > smoothed[top]!)) top = i;
  if (top < 0 || !(smoothed[top]! > 0)) return { level: null, jacobian, reason: 'dark level not subtracted: no emission maximum found' };
  // full width at half maximum of the strongest band, walking both ways on the smoothed signal
  const half = smoothed[top]! / 2;
  let a = top;
  while (a > 0 && smoothed[a]! > half) a--;
  let b = top;
  while (b < n - 1 && smoothed[b]! > half) b++;
  const fwhm = Math.max(energy[b]! - energy[a]!, 2 * (energy[1]! - energy[0]!));
  const lo = energy[top]! - 3 * fwhm;
  const hi = energy[top]! + 3 * fwhm;
  let syj = 0;
  let sjj = 0;
  let m = 0;
  for (let i = g; i < n - g; i++) {
    const e = energy[i]!;
    if ((e > lo && e < hi) || excluded(e)) continue;
    syj += raw[i]! * jacobian[i]!;
    sjj += jacobian[i]! * jacobian[i]!;
    m++;
  }
  if (m < 16 || !(sjj > 0)) {
    return {
      level: null,
      jacobian,
      reason: `dark level not subtracted: fewer than 16 points lie more than 3 FWHM (${(3 * fwhm * 1000).toFixed(0)} meV) from the emission maximum`,
    };
  }
  return { level: syj / sjj, jacobian, reason: '' };
}
