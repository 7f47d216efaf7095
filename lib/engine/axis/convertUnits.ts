import { CM1_PER_EV, HC_EV_NM } from '../constants';
import type { XUnit } from '../types';

/** Photon energy (eV) of a wavelength in nm: E = hc/λ, hc = 1239.841984 eV·nm (CODATA 2018). */
export function nmToEv(nm: number): number {
  return HC_EV_NM / nm;
}
/** Wavelength (nm) of a photon energy in eV. */
export function evToNm(ev: number): number {
  return HC_EV_NM / ev;
}
/** Energy (eV) of a wavenumber in cm⁻¹: 1 eV = 8065.54394 cm⁻¹ (CODATA 2018). */
export function wavenumberToEv(cm1: number): number {
  return cm1 / CM1_PER_EV;
}
/** Wavenumber (cm⁻¹) of an energy in eV. */
export function evToWavenumber(ev: number): number {
  return ev * CM1_PER_EV;
}
/** Energy in eV of one X value in the given unit. */
export function xToEv(x: number, unit: XUnit): number {
  switch (unit) {
    case 'nm':
      return HC_EV_NM / x;
    case 'um':
      return HC_EV_NM / (x * 1000);
    case 'cm-1':
      return x / CM1_PER_EV;
    case 'eV':
      return x;
  }
}
/** X value in the given unit of an energy in eV. */
export function evToX(ev: number, unit: XUnit): number {
  switch (unit) {
    case 'nm':
      return HC_EV_NM / ev;
    case 'um':
      return HC_EV_NM / ev / 1000;
    case 'cm-1':
      return ev * CM1_PER_EV;
    case 'eV':
      return ev;
  }
}
