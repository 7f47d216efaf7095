import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseSpectrumFile, SpectrumFileError } from '../../lib/engine/index';
import { realDir } from './scipy';

const read = (f: string) => new Uint8Array(readFileSync(path.join(realDir, f)));
const enc = (s: string) => new TextEncoder().encode(s);

// Expected counts and ranges are those stated by the files themselves (headers, NPOINTS,
// FIRSTX/LASTX) and by real-spectra/PROVENANCE.md.
describe('real instrument files parse as their headers state', () => {
  const csv: Array<[string, number, number, number, number]> = [
    ['cdse-absorbance-growth-series.csv', 251, 350, 600, 16],
    ['cdse-absorbance-metadata-footer.csv', 451, 350, 800, 6],
    ['cdse-absorbance-blank-rows.csv', 301, 350, 650, 18],
    ['cdse-pl-growth-series-bom.csv', 181, 420, 600, 14],
    ['cdse-pl-excitation-footer.csv', 201, 250, 450, 18],
  ];
  for (const [f, n, lo, hi, cols] of csv) {
    it(`${f}: ${n} points, ${lo}–${hi} nm, ${cols} Y columns (PROVENANCE.md)`, () => {
      const s = parseSpectrumFile(f, read(f));
      expect(s.x.length).toBe(n);
      expect(s.x[0]).toBeCloseTo(lo, 0);
      expect(s.x[s.x.length - 1]).toBeCloseTo(hi, 0);
      expect(s.availableColumns).toHaveLength(cols);
      expect(s.xUnit).toBe('nm');
      for (let i = 1; i < s.x.length; i++) expect(s.x[i]).toBeGreaterThan(s.x[i - 1]!);
    });
  }
  it('BOM file: the X header is read cleanly (no byte-order mark in the name)', () => {
    const s = parseSpectrumFile('cdse-pl-growth-series-bom.csv', read('cdse-pl-growth-series-bom.csv'));
    expect(s.columnName).toBe('60 s reaction');
    expect(s.technique).toBe('pl');
  });
  it('missing cells: a column with empty cells keeps only its points and says so', () => {
    const f = 'cdse-pl-missing-cells.csv';
    const s = parseSpectrumFile(f, read(f), { column: 'Run 3 30 s' });
    const all = parseSpectrumFile(f, read(f), { column: 1 });
    expect(all.x.length).toBe(151);
    expect(s.x.length).toBeLessThan(151);
    expect(s.warnings.join(' ')).toMatch(/empty cell/);
  });
  it('column chosen by name and by index give the same data', () => {
    const f = 'cdse-absorbance-growth-series.csv';
    const a = parseSpectrumFile(f, read(f), { column: '240 s' });
    const b = parseSpectrumFile(f, read(f), { column: 8 });
    expect(a.columnName).toBe('240 s');
    expect(Array.from(a.y)).toEqual(Array.from(b.y));
  });
  for (const f of [
    'carbon-dots-absorbance-decimal-comma.txt',
    'carbon-dots-pl-ex365-decimal-comma.txt',
    'quinine-sulfate-absorbance-decimal-comma.txt',
    'quinine-sulfate-pl-ex365-decimal-comma.txt',
    'carbon-dots-pl-ex365-weak-with-scatter.txt',
  ]) {
    it(`${f}: decimal comma, tab separated, point count equals its "Number of Pixels" header`, () => {
      const s = parseSpectrumFile(f, read(f));
      expect(s.x.length).toBe(Number(s.metadata['Number of Pixels in Spectrum']));
      expect(s.x.length).toBe(2068);
      expect(s.x[0]).toBeCloseTo(199.4, 6);
      expect(s.x[s.x.length - 1]).toBeCloseTo(1108.3, 6);
    });
  }
  it('quinine sulfate absorbance: A(365 nm) ≈ 0.095 (PROVENANCE.md)', () => {
    const s = parseSpectrumFile('q.txt', read('quinine-sulfate-absorbance-decimal-comma.txt'), { yUnit: 'absorbance' });
    let k = 0;
    for (let i = 0; i < s.x.length; i++) if (Math.abs(s.x[i]! - 365) < Math.abs(s.x[k]! - 365)) k = i;
    expect(s.y[k]).toBeGreaterThan(0.07);
    expect(s.y[k]).toBeLessThan(0.12);
  });
  const jdx: Array<[string, number, number, number, 'nm' | 'cm-1']> = [
    ['uvvis-jcamp-sqz-dif-dup.jdx', 440, 250, 469.5, 'nm'],
    ['ir-jcamp-sqz-dif-dup.jdx', 3951, 450, 4400, 'cm-1'],
    ['ir-jcamp-affn.jdx', 3951, 450, 4400.007, 'cm-1'],
    ['ir-jcamp-pac.jdx', 3301, 700, 4000, 'cm-1'],
  ];
  for (const [f, n, lo, hi, unit] of jdx) {
    it(`${f}: ${n} points = ##NPOINTS, ${lo}–${hi} (##FIRSTX/##LASTX)`, () => {
      const s = parseSpectrumFile(f, read(f));
      expect(s.format).toBe('jcamp-dx');
      expect(s.x.length).toBe(n);
      expect(Number(s.metadata['NPOINTS'])).toBe(n);
      expect(s.x[0]).toBeCloseTo(lo, 3);
      expect(s.x[s.x.length - 1]).toBeCloseTo(hi, 3);
      expect(s.xUnit).toBe(unit);
    });
  }
  it('UV-Vis JCAMP first Y equals ##FIRSTY (1.1663)', () => {
    const s = parseSpectrumFile('u.jdx', read('uvvis-jcamp-sqz-dif-dup.jdx'));
    expect(s.y[0]).toBeCloseTo(1.1663, 6);
  });
});

describe('delimited text layouts', () => {
  const rows = (sep: string, dec: string, n = 20, desc = false) =>
    Array.from({ length: n }, (_, i) => {
      const x = desc ? 600 - i : 400 + i;
      return [x, 0.1 * i + 0.05].map((v) => String(v).replace('.', dec)).join(sep);
    }).join('\n');
  it.each([
    [',', '.'],
    [';', ','],
    ['\t', ','],
    [' ', '.'],
    ['\t', '.'],
  ])('separator %j with decimal %j', (sep, dec) => {
    const text = `Instrument: test\nPath length: 1 cm\nWavelength (nm)${sep === ' ' ? ' ' : sep}Absorbance\n${rows(sep, dec)}\n`;
    const s = parseSpectrumFile('t.txt', enc(text));
    expect(s.x.length).toBe(20);
    expect(s.y[3]).toBeCloseTo(0.35, 12);
    expect(s.yUnit).toBe('absorbance');
    expect(s.pathLengthCm).toBe(1);
  });
  it('descending X is sorted ascending; duplicated X values are averaged with a warning', () => {
    const text = `Wavelength (nm),Absorbance\n${rows(',', '.', 20, true)}\n581,0.7\n`;
    const s = parseSpectrumFile('d.csv', enc(text));
    expect(s.xOrderInFile).toBe('descending');
    expect(s.x[0]).toBe(581);
    expect(s.x.length).toBe(20);
    expect(s.warnings.join(' ')).toMatch(/duplicated/);
  });
  it('reads units: cm-1 + %T → ir; eV + counts → pl', () => {
    const a = parseSpectrumFile('a.csv', enc(`Wavenumber (cm-1),%T\n${rows(',', '.')}`));
    expect([a.xUnit, a.yUnit, a.technique]).toEqual(['cm-1', 'percent-transmittance', 'ir']);
    const b = parseSpectrumFile(
      'b.csv',
      enc(`Energy (eV),Counts\n${Array.from({ length: 20 }, (_, i) => `${1.5 + 0.01 * i},${i}`).join('\n')}`),
    );
    expect([b.xUnit, b.yUnit, b.technique]).toEqual(['eV', 'counts', 'pl']);
  });
});

describe('rejected files name the file, the place and the problem', () => {
  const bad = (name: string, bytes: Uint8Array, re: RegExp, opts = {}) => {
    let err: unknown;
    try {
      parseSpectrumFile(name, bytes, opts);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(SpectrumFileError);
    const m = (err as Error).message;
    expect(m).toMatch(re);
    expect(m.startsWith(name)).toBe(true);
    expect(m).not.toMatch(/\n|    at /);
    return err as SpectrumFileError;
  };
  const good = (n: number) => `Wavelength (nm),Absorbance\n${Array.from({ length: n }, (_, i) => `${400 + i},${0.01 * i}`).join('\n')}`;
  it('empty', () => bad('e.csv', new Uint8Array(0), /empty/));
  it('binary', () => bad('b.csv', Uint8Array.from([0x50, 0x4b, 3, 4, 0, 0, 1, 2, 3]), /binary/));
  it('fewer than 16 points', () => bad('s.csv', enc(good(10)), /only 10 data points/));
  it('non-numeric value, with line and column', () => {
    const lines = good(30).split('\n');
    lines[11] = '410,abc';
    const e = bad('n.csv', enc(lines.join('\n')), /line 12, column "Absorbance": value "abc" is not a number/);
    expect(e.line).toBe(12);
  });
  it('non-finite value', () => {
    const lines = good(30).split('\n');
    lines[5] = '404,NaN';
    bad('f.csv', enc(lines.join('\n')), /line 6.*not finite/);
  });
  it('X not monotonic', () => {
    const lines = good(30).split('\n');
    lines[20] = '405,0.3';
    bad('m.csv', enc(lines.join('\n')), /line 21.*not monotonic/);
  });
  it('damaged X in the middle of the data', () => {
    const lines = good(30).split('\n');
    lines[15] = 'x14,0.3';
    bad('x.csv', enc(lines.join('\n')), /line 16.*X value "x14" is not a number/);
  });
  it('unknown units with no user choice; accepted when the user chooses', () => {
    // 2000 → 1981 written high to low fits both a near-IR scan in nm and an IR scan in cm-1 (docs/ingest.md rule 5)
    const text = `a,b\n${Array.from({ length: 20 }, (_, i) => `${2000 - i},${i}`).join('\n')}`;
    bad('u.csv', enc(text), /X unit unknown.*could be nm or cm⁻¹/);
    bad('u.csv', enc(text), /Y unit unknown/, { xUnit: 'nm' });
    const s = parseSpectrumFile('u.csv', enc(text), { xUnit: 'nm', yUnit: 'counts' });
    expect(s.x.length).toBe(20);
    expect(s.xUnitSource).toBe('chosen');
  });
  it('over the size limit (option, default 20 MiB)', () => bad('big.csv', enc(good(100)), /over the 100-byte limit/, { maxBytes: 100 }));
  it('line over the length limit (option, default 1 MiB)', () => {
    bad('long.csv', enc(`${'#'.repeat(5000)}\n${good(20)}`), /line 1: line is 5000 characters long/, { maxLineLength: 4096 });
  });
  it('unknown column name', () => bad('c.csv', enc(good(20)), /no column named "Z"/, { column: 'Z' }));
  it('JCAMP-DX whose data are cut short (NPOINTS mismatch)', () => {
    const text = readFileSync(path.join(realDir, 'ir-jcamp-pac.jdx'), 'latin1').split(/\r?\n/);
    const cut = text.filter((_, i) => i < 40 || i > 60).join('\n');
    bad('cut.jdx', enc(cut), /NPOINTS/);
  });
});
