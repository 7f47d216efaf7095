// The X unit inferred from bare values must agree with what the real files' own headers state
// (real-spectra/PROVENANCE.md); the eV case converts those wavelengths with hc = 1239.841984 eV·nm (CODATA 2018).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseSpectrumFile } from '../../lib/engine/index';
import { inferXUnit } from '../../lib/engine/parse/inferXUnit';
import { realDir } from './scipy';

const read = (f: string) => new Uint8Array(readFileSync(path.join(realDir, f)));
/** X values in the order the file writes them (the parser sorts ascending; xOrderInFile says how it was written). */
const asWritten = (f: string) => {
  const s = parseSpectrumFile(f, read(f));
  const x = Array.from(s.x);
  return { x: s.xOrderInFile === 'descending' ? x.reverse() : x, stated: s.xUnit };
};

describe('inferXUnit agrees with the units real files state in their headers', () => {
  const files = [
    'cdse-absorbance-growth-series.csv', // 600 → 350 nm
    'cdse-pl-excitation-footer.csv', // 250 → 450 nm
    'carbon-dots-absorbance-decimal-comma.txt', // 199 → 1108 nm
    'uvvis-jcamp-sqz-dif-dup.jdx', // 250 → 469.5 nm
    'ir-jcamp-affn.jdx', // 4400 → 450 cm-1, high to low
    'ir-jcamp-pac.jdx', // 4000 → 700 cm-1
  ];
  for (const f of files) {
    it(f, () => {
      const { x, stated } = asWritten(f);
      expect(inferXUnit(x).unit).toBe(stated);
    });
  }
  it('the CdSe wavelengths converted to photon energy read as eV', () => {
    const { x } = asWritten('cdse-absorbance-growth-series.csv');
    expect(inferXUnit(x.map((nm) => 1239.841984 / nm)).unit).toBe('eV');
  });
});

describe('inferXUnit asks where two units fit the same numbers (rules in docs/ingest.md)', () => {
  const ramp = (from: number, to: number, n = 50) => Array.from({ length: n }, (_, i) => from + ((to - from) * i) / (n - 1));
  it('0.6–2.4 could be near-IR µm or low-energy eV', () => {
    const r = inferXUnit(ramp(0.6, 2.4));
    expect(r.unit).toBeUndefined();
    expect(r.unit === undefined && r.candidates).toEqual(['eV', 'um']);
  });
  it('2000 → 1200 written high to low could be nm or cm-1; low to high it is a near-IR scan in nm', () => {
    expect(inferXUnit(ramp(2000, 1200)).unit).toBeUndefined();
    expect(inferXUnit(ramp(1200, 2000)).unit).toBe('nm');
  });
  it('2.5–25 reads as mid-IR µm', () => expect(inferXUnit(ramp(2.5, 25)).unit).toBe('um'));
  it('seconds 0–199 (a kinetics trace) are not taken for any unit', () => expect(inferXUnit(ramp(0, 199)).unit).toBeUndefined());
});
