import { describe, expect, it } from 'vitest';
import { nmToEv, evToNm, wavenumberToEv, evToWavenumber } from '../../lib/engine/axis/convertUnits';
import { toEnergyAxis } from '../../lib/engine/axis/toEnergyAxis';

// CODATA 2018: h = 6.62607015e-34 J s, c = 299792458 m/s, e = 1.602176634e-19 C (all exact).
const H = 6.62607015e-34;
const C = 299792458;
const E = 1.602176634e-19;

describe('unit conversions vs CODATA 2018', () => {
  it('hc = 1239.841984 eV·nm from exact h, c, e', () => {
    const hc = ((H * C) / E) * 1e9;
    expect(nmToEv(1) / hc).toBeCloseTo(1, 9);
    expect(nmToEv(500)).toBeCloseTo(hc / 500, 8);
    expect(evToNm(nmToEv(632.8))).toBeCloseTo(632.8, 10);
  });
  it('1 eV = 8065.54394 cm⁻¹ (= e/(hc·100))', () => {
    const perEv = E / (H * C * 100);
    expect(evToWavenumber(1) / perEv).toBeCloseTo(1, 9);
    expect(wavenumberToEv(2180)).toBeCloseTo(2180 / perEv, 9);
  });
  it('emission Jacobian I(E) = I(λ)λ²/hc preserves the integral (Mooney & Kambhampati 2013)', () => {
    const n = 4001;
    const x = Float64Array.from({ length: n }, (_, i) => 450 + (200 * i) / (n - 1));
    const y = x.map((l) => Math.exp(-0.5 * ((l - 550) / 15) ** 2));
    const trap = (a: Float64Array, b: Float64Array) => {
      let s = 0;
      for (let i = 1; i < a.length; i++) s += 0.5 * (b[i]! + b[i - 1]!) * (a[i]! - a[i - 1]!);
      return s;
    };
    const { energy, signal } = toEnergyAxis(x, y, 'nm', { emission: true });
    expect(trap(energy, signal) / trap(x, y)).toBeCloseTo(1, 5);
    // absorbance: axis only
    const abs = toEnergyAxis(x, y, 'nm');
    expect(abs.signal[0]).toBe(y[n - 1]);
    expect(Array.from(x)).toEqual(Array.from(Float64Array.from({ length: n }, (_, i) => 450 + (200 * i) / (n - 1))));
  });
});
