import { CM1_PER_EV, HC_EV_NM } from '../constants';
import type { XUnit } from '../types';
import { xToEv } from './convertUnits';

/**
 * Converts a spectrum to an ascending energy axis (eV). For emission (a density per unit of x),
 * the Jacobian is applied so that integrated areas are preserved: I(E) = I(λ)·λ²/hc for λ in nm
 * (Mooney & Kambhampati, J. Phys. Chem. Lett. 2013, 4, 3316), I(E) = I(ν̃)·8065.54394 for
 * cm⁻¹. Absorbance and transmittance are not densities: only the axis changes.
 * Returns new arrays; inputs are not modified.
 */
export function toEnergyAxis(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  unit: XUnit,
  options: { emission?: boolean } = {},
): { energy: Float64Array; signal: Float64Array } {
  if (x.length !== y.length) throw new RangeError('x and y must have the same length');
  const n = x.length;
  const e = new Float64Array(n);
  const s = new Float64Array(n);
  // constants and the unit switch hoisted out of the per-point loop
  const hc = HC_EV_NM;
  const cm1 = CM1_PER_EV;
  const emission = options.emission === true;
  for (let i = 0; i < n; i++) {
    const xi = x[i]!;
    const v = y[i]!;
    switch (unit) {
      case 'nm':
        e[i] = hc / xi;
        s[i] = emission ? (v * xi * xi) / hc : v;
        break;
      case 'um':
        e[i] = hc / (xi * 1000);
        s[i] = emission ? (v * xi * xi * 1000) / hc : v;
        break;
      case 'cm-1':
        e[i] = xi / cm1;
        s[i] = emission ? v * cm1 : v;
        break;
      case 'eV':
        e[i] = xToEv(xi, unit);
        s[i] = v;
        break;
    }
  }
  if (n > 1 && e[0]! > e[n - 1]!) {
    e.reverse();
    s.reverse();
  }
  return { energy: e, signal: s };
}
