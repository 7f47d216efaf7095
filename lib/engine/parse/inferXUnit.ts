import type { XUnit } from '../types';

export type XUnitInference = { unit: XUnit; rule: string } | { unit: undefined; candidates: XUnit[]; rule: string };

/**
 * Infers the X unit of a headerless column from its values, only where the ranges used for
 * optical spectra of nanocrystals do not overlap (common practice; the rules are listed in
 * docs/ingest.md). Returns the candidates instead when two units fit the same numbers.
 * The rules, on the smallest (lo) and largest (hi) value, are numbered and explained in
 * docs/ingest.md ("X unit without a header").
 */
export function inferXUnit(x: ArrayLike<number>): XUnitInference {
  const n = x.length;
  if (n < 2) return { unit: undefined, candidates: [], rule: 'too few values' };
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = x[i]!;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  const descending = x[0]! > x[n - 1]!;
  const range = `${round(lo)}–${round(hi)}`;
  if (!(lo > 0)) return { unit: undefined, candidates: [], rule: `values ${range} include zero or negatives` };
  if (lo >= 1 && hi <= 6.5) return { unit: 'eV', rule: `values ${range} lie in 1–6.5, photon energies in eV` };
  if (lo >= 2.5 && hi > 6.5 && hi <= 30) return { unit: 'um', rule: `values ${range} lie in 2.5–30, mid-IR wavelengths in µm` };
  if (lo < 1 && hi <= 6.5) return { unit: undefined, candidates: ['eV', 'um'], rule: `values ${range} could be eV or µm` };
  if (lo >= 150 && hi <= 1100) return { unit: 'nm', rule: `values ${range} lie in 150–1100, UV–visible–near-IR wavelengths in nm` };
  if (lo >= 150 && hi <= 2600) {
    return descending
      ? { unit: undefined, candidates: ['nm', 'cm-1'], rule: `values ${range}, written high to low, could be nm or cm⁻¹` }
      : { unit: 'nm', rule: `values ${range}, written low to high, lie in 150–2600, wavelengths in nm` };
  }
  if (lo >= 200 && hi >= 3000 && hi <= 8000) {
    if (descending || hi > 3300)
      return { unit: 'cm-1', rule: `values ${range}${descending ? ', written high to low,' : ''} are IR wavenumbers in cm⁻¹` };
    return { unit: undefined, candidates: ['nm', 'cm-1'], rule: `values ${range} could be nm or cm⁻¹` };
  }
  if (lo >= 150 && hi < 3000) return { unit: undefined, candidates: ['nm', 'cm-1'], rule: `values ${range} could be nm or cm⁻¹` };
  return { unit: undefined, candidates: [], rule: `values ${range} fit no X unit` };
}

function round(v: number): string {
  return String(Number(v.toPrecision(4)));
}
