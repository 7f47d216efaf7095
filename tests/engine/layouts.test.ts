// Every accepted layout and encoding gives the same spectrum, and the same peaks, as the same
// numbers in the plain layout. The numbers come from a real instrument export
// (real-spectra/cdse-absorbance-growth-series.csv, PROVENANCE.md); the layouts are written here by
// test code from the file's cells, split with String.split (not with the parser under test).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import ExcelJS from 'exceljs';
import iconv from 'iconv-lite';
import { describe, expect, it } from 'vitest';
import { analyzeSpectrum, parseSpectrumBytes, parseSpectrumFile, SpectrumFileError } from '../../lib/engine/index';
import type { ParseOptions, ParsedSpectrum } from '../../lib/engine/index';
import { realDir } from './scipy';

const source = readFileSync(path.join(realDir, 'cdse-absorbance-growth-series.csv'), 'utf8')
  .split(/\r?\n/)
  .filter((l) => l.trim().length > 0);
const header = source[0]!.split(',');
const body = source.slice(1).map((l) => l.split(','));
/** X and three Y columns of the real file: 30 s, 240 s and 600 s aliquots. */
const picks = ['30 s', '240 s', '600 s'].map((h) => header.indexOf(h));
const xs = body.map((r) => r[0]!);
const col = (k: number) => body.map((r) => r[picks[k]!]!);

const plainCsv = ['Wavelength (nm),30 s,240 s,600 s', ...xs.map((x, i) => `${x},${col(0)[i]},${col(1)[i]},${col(2)[i]}`)].join('\r\n');
const utf8 = (s: string) => new Uint8Array(Buffer.from(s, 'utf8'));

const ABS: ParseOptions = { technique: 'absorption' };
const plain = (k: number) => parseSpectrumFile('plain.csv', utf8(plainCsv), { ...ABS, column: k + 1 });

function sameSpectrum(a: ParsedSpectrum, b: ParsedSpectrum): void {
  expect(a.xUnit).toBe(b.xUnit);
  expect(a.yUnit).toBe(b.yUnit);
  expect(Array.from(a.x)).toEqual(Array.from(b.x));
  expect(Array.from(a.y)).toEqual(Array.from(b.y));
  const pa = analyzeSpectrum(a, { technique: 'absorption' }).peaks;
  const pb = analyzeSpectrum(b, { technique: 'absorption' }).peaks;
  expect(pa.length).toBeGreaterThan(0);
  expect(pa.map((p) => [p.kind, p.energyEv, p.height])).toEqual(pb.map((p) => [p.kind, p.energyEv, p.height]));
}

describe('the plain file is the real export', () => {
  it('has 251 points 350–600 nm (PROVENANCE.md)', () => {
    const s = plain(1);
    expect(s.x.length).toBe(251);
    expect(s.layout).toBe('x-then-y');
    expect(s.encoding).toBe('utf-8');
    expect(s.xUnitSource).toBe('file');
  });
});

describe('headerless files: X unit inferred from the values, and stated as inferred', () => {
  for (const width of [2, 3]) {
    it(`${width} columns, no header`, () => {
      const text = xs.map((x, i) => [x, col(1)[i], col(2)[i]].slice(0, width).join(',')).join('\n');
      const s = parseSpectrumFile(`bare${width}.csv`, utf8(text), ABS);
      expect(s.xUnitSource).toBe('values');
      expect(s.warnings.join(' ')).toMatch(/X unit nm inferred from the values/);
      sameSpectrum(s, plain(1));
      expect(s.traces).toHaveLength(width - 1);
    });
  }
  it('an explicit choice wins over the inference and is recorded as chosen', () => {
    const text = xs.map((x, i) => `${x}\t${col(1)[i]}`).join('\n');
    const s = parseSpectrumFile('bare.txt', utf8(text), { ...ABS, xUnit: 'nm' });
    expect(s.xUnitSource).toBe('chosen');
    sameSpectrum(s, plain(1));
  });
});

describe('encodings: the same text in every accepted encoding', () => {
  const latinHeader = 'Wellenlänge (nm);Extinktion 30 s;Extinktion 240 s;Extinktion 600 s';
  const latinText = [
    latinHeader,
    ...xs.map(
      (x, i) => `${x.replace('.', ',')};${col(0)[i]!.replace('.', ',')};${col(1)[i]!.replace('.', ',')};${col(2)[i]!.replace('.', ',')}`,
    ),
  ].join('\r\n');
  const cases: Array<[string, Uint8Array, string]> = [
    ['UTF-8 with BOM', new Uint8Array(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(plainCsv, 'utf8')])), 'utf-8-bom'],
    ['UTF-16 LE with BOM', new Uint8Array(iconv.encode(plainCsv, 'utf-16le', { addBOM: true })), 'utf-16le'],
    ['UTF-16 BE with BOM', new Uint8Array(iconv.encode(plainCsv, 'utf-16be', { addBOM: true })), 'utf-16be'],
  ];
  for (const [name, bytes, encoding] of cases) {
    it(name, () => {
      const s = parseSpectrumFile('enc.csv', bytes, { ...ABS, column: '240 s' });
      expect(s.encoding).toBe(encoding);
      expect(s.columnName).toBe('240 s');
      sameSpectrum(s, plain(1));
    });
  }
  it('single-byte Windows text (ä in the header, decimal comma) decodes to the right letters', () => {
    const bytes = new Uint8Array(iconv.encode(latinText, 'windows-1252'));
    expect(() => new TextDecoder('utf-8', { fatal: true }).decode(bytes)).toThrow();
    const s = parseSpectrumFile('latin.csv', bytes, { ...ABS, column: 2 });
    expect(['windows-1252', 'iso-8859-1', 'iso-8859-15']).toContain(s.encoding);
    expect(s.columnName).toBe('Extinktion 240 s');
    sameSpectrum(s, plain(1));
  });
});

describe('layouts', () => {
  it('X,Y pairs side by side with a group-header line in a non-Latin script: the column choice names the pair', () => {
    const groups = 'Образец А,,Образец Б,,Образец В,';
    const names = '波長 (nm),吸光度,波長 (nm),吸光度,波長 (nm),吸光度';
    // the third pair is shorter: its last 20 rows are empty, as when ranges differ
    const rows = xs.map((x, i) => [x, col(0)[i], x, col(1)[i], i < xs.length - 20 ? x : '', i < xs.length - 20 ? col(2)[i] : ''].join(','));
    const bytes = utf8([groups, names, ...rows].join('\n'));
    const byIndex = parseSpectrumFile('pairs.csv', bytes, { ...ABS, column: 3 });
    expect(byIndex.layout).toBe('pairs');
    expect(byIndex.pair).toBe(2);
    expect(byIndex.columnName).toBe('Образец Б / 吸光度');
    sameSpectrum(byIndex, plain(1));
    const byPair = parseSpectrumFile('pairs.csv', bytes, { ...ABS, pair: 2 });
    expect(Array.from(byPair.y)).toEqual(Array.from(byIndex.y));
    const byName = parseSpectrumFile('pairs.csv', bytes, { ...ABS, column: 'Образец Б / 吸光度' });
    expect(Array.from(byName.y)).toEqual(Array.from(byIndex.y));
    const third = parseSpectrumFile('pairs.csv', bytes, { ...ABS, pair: 3 });
    expect(third.x.length).toBe(251 - 20);
    expect(byIndex.traces!.map((t) => t.group)).toEqual(['Образец А', 'Образец Б', 'Образец В']);
    expect(() => parseSpectrumFile('pairs.csv', bytes, { ...ABS, column: 2 })).toThrow(
      /column 2 is the X column of pair 2.*choose its Y column 3 or pair 2/,
    );
    expect(() => parseSpectrumFile('pairs.csv', bytes, { ...ABS, column: 7 })).toThrow(/out of range: Y columns are 1, 3, 5/);
  });

  it('blocks one after another, each with its own header', () => {
    const block = (k: number) => [`Wavelength (nm),${header[picks[k]!]}`, ...xs.map((x, i) => `${x},${col(k)[i]}`)];
    const bytes = utf8(['Instrument: bench spectrometer 1', '', ...block(0), '', ...block(1), '', ...block(2), ''].join('\n'));
    const s = parseSpectrumFile('blocks.csv', bytes, { ...ABS, block: 2 });
    expect(s.layout).toBe('blocks');
    expect(s.traces!.map((t) => t.label)).toEqual(['block 1 / 30 s', 'block 2 / 240 s', 'block 3 / 600 s']);
    sameSpectrum(s, plain(1));
    const byName = parseSpectrumFile('blocks.csv', bytes, { ...ABS, column: '600 s' });
    sameSpectrum(byName, plain(2));
    expect(s.metadata['Instrument']).toBe('bench spectrometer 1');
  });

  it('X followed by many Y columns, with a group-header line', () => {
    const bytes = utf8([',Probe series,,', plainCsv].join('\n'));
    const s = parseSpectrumFile('groups.csv', bytes, { ...ABS, column: 2 });
    expect(s.columnName).toBe('Probe series / 240 s');
    sameSpectrum(s, plain(1));
  });

  it('spreadsheet (.xlsx): the sheet with the table is found, or chosen by name', async () => {
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet('Notes').addRow(['Operator notes only']);
    const ws = wb.addWorksheet('Results');
    ws.addRow(['Wavelength (nm)', '30 s', '240 s', '600 s']);
    xs.forEach((x, i) => ws.addRow([Number(x), Number(col(0)[i]), Number(col(1)[i]), Number(col(2)[i])]));
    const bytes = new Uint8Array(await wb.xlsx.writeBuffer());
    const s = await parseSpectrumBytes('book.xlsx', bytes, { ...ABS, column: '240 s' });
    expect(s.format).toBe('spreadsheet');
    expect(s.sheet).toBe('Results');
    expect(s.sheets).toEqual(['Notes', 'Results']);
    sameSpectrum(s, plain(1));
    // the same bytes under a name without .xlsx are still read as a workbook, never as a zip of files
    const renamed = await parseSpectrumBytes('export.bin', bytes, { ...ABS, column: '240 s', sheet: 'Results' });
    expect(Array.from(renamed.y)).toEqual(Array.from(s.y));
    await expect(parseSpectrumBytes('book.xlsx', bytes, { ...ABS, sheet: 'Notes' })).rejects.toThrow(
      "book.xlsx: no numeric table found on sheet 'Notes'; export the sheet as CSV or choose another sheet",
    );
  });
});

describe('header series values', () => {
  it('"0.5 eq", "10 µM", "t = 30 s" and "240 s reaction" carry a value and a unit', () => {
    const text = [
      'Wavelength (nm),0.5 eq,10 µM,t = 30 s,240 s reaction',
      ...xs.map((x, i) => `${x},${col(0)[i]},${col(1)[i]},${col(2)[i]},${col(0)[i]}`),
    ].join('\n');
    const s = parseSpectrumFile('series.csv', utf8(text), ABS);
    expect(s.traces!.map((t) => t.seriesValue)).toEqual([
      { value: 0.5, unit: 'eq' },
      { value: 10, unit: 'µM' },
      { value: 30, unit: 's' },
      { value: 240, unit: 's' },
    ]);
  });
  it('a header without a number and unit carries none', () => {
    const s = parseSpectrumFile('plain.csv', utf8(plainCsv.replace('30 s', 'Absorbance')), ABS);
    expect(s.traces![0]!.seriesValue).toBeUndefined();
  });
});

describe('new bad-file kinds end with one line naming the file and what to do', () => {
  const refuse = async (name: string, bytes: Uint8Array, re: RegExp, options: ParseOptions = ABS) => {
    let err: unknown;
    try {
      await parseSpectrumBytes(name, bytes, options);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(SpectrumFileError);
    const m = (err as Error).message;
    expect(m.startsWith(name)).toBe(true);
    expect(m).not.toMatch(/\n/);
    expect(m).toMatch(re);
  };
  it('a spreadsheet with no numbers', async () => {
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet('Results').addRow(['sample', 'comment']);
    await refuse(
      'words.xlsx',
      new Uint8Array(await wb.xlsx.writeBuffer()),
      /no numeric table found on sheet 'Results'; export the sheet as CSV or choose another sheet/,
    );
  });
  it('a block without X', async () => {
    const good = [`Wavelength (nm),30 s`, ...xs.map((x, i) => `${x},${col(0)[i]}`)];
    const noX = ['Absorbance A,Absorbance B', ...xs.map((_, i) => `${col(1)[i]},${col(2)[i]}`)];
    await refuse('nox.csv', utf8([...good, '', ...noX].join('\n')), /block 2 has no X column.*put the X values .* first/, {
      ...ABS,
      block: 2,
    });
  });
  it('mixed units in one column', async () => {
    await refuse(
      'mixed.csv',
      utf8(plainCsv.replace('Wavelength (nm)', 'Wavelength (nm) / Energy (eV)')),
      /mixed units in one column.*nm and eV; choose the X unit/,
    );
  });
  it('a UTF-16 file that is really binary', async () => {
    const junk = new Uint8Array(4096);
    for (let i = 0; i < junk.length; i++) junk[i] = (i * 7919) % 256;
    junk[0] = 0xff;
    junk[1] = 0xfe;
    await refuse('fake16.csv', junk, /starts like UTF-16 text but does not decode to text.*export it again as text/);
  });
  it('a headerless file whose values fit two units asks for the X unit', async () => {
    const text = Array.from({ length: 40 }, (_, i) => `${0.5 + i * 0.05},${i % 5}`).join('\n');
    await refuse('small.csv', utf8(text), /X unit unknown.*could be eV or µm; choose the X unit/);
  });
});
