import { AVOGADRO } from '../constants';

/** Beer–Lambert: c = A / (ε·l), mol/L, with ε in M⁻¹cm⁻¹ and l in cm. */
export function beerLambertConcentration(absorbance: number, extinctionPerMPerCm: number, pathLengthCm: number): number {
  if (!(extinctionPerMPerCm > 0)) throw new RangeError('extinction must be positive');
  if (!(pathLengthCm > 0)) throw new RangeError('path length must be positive');
  return absorbance / (extinctionPerMPerCm * pathLengthCm);
}

/** Particle molar mass, g/mol: M = N_A·ρ·πD³/6 (bulk density, ligands excluded). */
export function particleMolarMass(diameterNm: number, densityGPerCm3: number): number {
  if (!(diameterNm > 0)) throw new RangeError('diameter must be positive');
  if (!(densityGPerCm3 > 0)) throw new RangeError('density must be positive');
  const volumeCm3 = (Math.PI * (diameterNm * 1e-7) ** 3) / 6;
  return AVOGADRO * densityGPerCm3 * volumeCm3;
}
