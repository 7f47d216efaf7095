import type { MaterialName } from '../types';

export interface MaterialInfo {
  name: MaterialName;
  /** Elements, with a flag for those the UI should attach handling cautions to. */
  elements: Array<{ symbol: string; hazardous: boolean }>;
  /** Bulk density, g/cm³ (handbook values, from memory). */
  densityGPerCm3: number;
  /** Sizing curve used by default. */
  defaultSizing: SizingModelId;
}

export type SizingModelId = 'cdse-yu2003' | 'cdse-jasieniak2009' | 'cdte-yu2003' | 'cds-yu2003' | 'pbs-moreels2009' | 'pbse-moreels2007';

/**
 * Materials the engine can size. Data-driven so that the UI can attach cautions (Cd and Pb
 * compounds are toxic). Densities are bulk handbook values (from memory: CdSe 5.82, CdTe 5.85,
 * CdS 4.82, PbS 7.60, PbSe 8.10 g/cm³).
 */
export const MATERIALS: Readonly<Record<MaterialName, MaterialInfo>> = {
  CdSe: {
    name: 'CdSe',
    elements: [
      { symbol: 'Cd', hazardous: true },
      { symbol: 'Se', hazardous: false },
    ],
    densityGPerCm3: 5.82,
    defaultSizing: 'cdse-yu2003',
  },
  CdTe: {
    name: 'CdTe',
    elements: [
      { symbol: 'Cd', hazardous: true },
      { symbol: 'Te', hazardous: false },
    ],
    densityGPerCm3: 5.85,
    defaultSizing: 'cdte-yu2003',
  },
  CdS: {
    name: 'CdS',
    elements: [
      { symbol: 'Cd', hazardous: true },
      { symbol: 'S', hazardous: false },
    ],
    densityGPerCm3: 4.82,
    defaultSizing: 'cds-yu2003',
  },
  PbS: {
    name: 'PbS',
    elements: [
      { symbol: 'Pb', hazardous: true },
      { symbol: 'S', hazardous: false },
    ],
    densityGPerCm3: 7.6,
    defaultSizing: 'pbs-moreels2009',
  },
  PbSe: {
    name: 'PbSe',
    elements: [
      { symbol: 'Pb', hazardous: true },
      { symbol: 'Se', hazardous: false },
    ],
    densityGPerCm3: 8.1,
    defaultSizing: 'pbse-moreels2007',
  },
};

export function isMaterialName(s: string): s is MaterialName {
  return Object.prototype.hasOwnProperty.call(MATERIALS, s);
}
