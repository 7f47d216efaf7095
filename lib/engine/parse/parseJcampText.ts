import { convert } from 'jcampconverter';
import { SpectrumFileError } from '../errors';
import type { ParseOptions, XUnit, YUnit } from '../types';
import { detectXUnit, detectYUnit } from './detectUnits';

export interface JcampResult {
  x: Float64Array;
  y: Float64Array;
  xUnit: XUnit;
  yUnit: YUnit;
  columnName: string;
  columnIndex: number;
  availableColumns: string[];
  metadata: Record<string, string>;
  warnings: string[];
}

/**
 * Parses JCAMP-DX text (AFFN, PAC, SQZ, DIF, DUP forms; McDonald & Wilks, Appl. Spectrosc. 1988,
 * 42, 151; Lampen et al., Pure Appl. Chem. 1999, 71, 1549) with jcampconverter, then checks the
 * decoded point count against ##NPOINTS. Header MINY/MAXY are not checked (often wrong).
 */
export function parseJcampText(fileName: string, text: string, options: ParseOptions): JcampResult {
  const warnings: string[] = [];
  let result: ReturnType<typeof convert>;
  try {
    result = convert(text, { keepRecordsRegExp: /.*/ });
  } catch (e) {
    const msg = e instanceof Error ? e.message.split('\n')[0] : String(e);
    throw new SpectrumFileError(fileName, `JCAMP-DX could not be decoded: ${msg}`);
  }
  const blocks = result.flatten.filter((b) => b.spectra && b.spectra.length > 0 && b.spectra[0]!.data);
  if (blocks.length === 0) throw new SpectrumFileError(fileName, 'JCAMP-DX file holds no XYDATA or XYPOINTS block');
  const names = blocks.map((b, i) => (b.title ? String(b.title).trim() : `block ${i + 1}`));
  let index = 0;
  if (options.column !== undefined) {
    const byName = typeof options.column === 'string' ? names.indexOf(options.column) : -1;
    if (byName >= 0) index = byName;
    else {
      const k = Number(options.column);
      if (!Number.isInteger(k) || k < 1 || k > blocks.length) {
        throw new SpectrumFileError(fileName, `JCAMP-DX has ${blocks.length} block(s); choose 1..${blocks.length}`, {
          column: options.column,
        });
      }
      index = k - 1;
    }
  } else if (blocks.length > 1) {
    warnings.push(`JCAMP-DX file holds ${blocks.length} spectra; the first was used`);
  }
  const block = blocks[index]!;
  const spectrum = block.spectra[0]!;
  const data = spectrum.data as unknown as { x: ArrayLike<number>; y: ArrayLike<number> };
  const info = (block.info ?? {}) as Record<string, unknown>;
  const metadata: Record<string, string> = {};
  for (const [k, v] of Object.entries(info)) {
    if (v === undefined || v === null) continue;
    metadata[k] = String(Array.isArray(v) ? v.join(' ') : v).slice(0, 1000);
  }
  const n = data.x.length;
  const declared = Number(info.NPOINTS);
  if (Number.isFinite(declared) && declared > 0 && declared !== n) {
    throw new SpectrumFileError(fileName, `JCAMP-DX decoded ${n} points but ##NPOINTS says ${declared}; the data block is damaged`);
  }
  const xText = String(spectrum.xUnits ?? info.XUNITS ?? '');
  const yText = String(spectrum.yUnits ?? info.YUNITS ?? '');
  const xUnit = options.xUnit ?? jcampXUnit(xText) ?? detectXUnit(xText);
  if (!xUnit) throw new SpectrumFileError(fileName, `X unit "${xText}" not understood; choose the X unit`, { column: 'XUNITS' });
  const yUnit = options.yUnit ?? jcampYUnit(yText) ?? detectYUnit(yText);
  if (!yUnit) throw new SpectrumFileError(fileName, `Y unit "${yText}" not understood; choose the Y unit`, { column: 'YUNITS' });
  const x = Float64Array.from(data.x as ArrayLike<number>);
  const y = Float64Array.from(data.y as ArrayLike<number>);
  if (yUnit === 'percent-transmittance' && /TRANSMITTANCE/i.test(yText)) {
    let max = -Infinity;
    for (let i = 0; i < n; i++) if (y[i]! > max) max = y[i]!;
    if (max <= 1.5) {
      for (let i = 0; i < n; i++) y[i] = y[i]! * 100;
      warnings.push('transmittance given as a fraction was converted to %T');
    }
  }
  return { x, y, xUnit, yUnit, columnName: names[index]!, columnIndex: index + 1, availableColumns: names, metadata, warnings };
}

function jcampXUnit(s: string): XUnit | undefined {
  const t = s.trim().toUpperCase();
  if (t === 'NANOMETERS' || t === 'NM') return 'nm';
  if (t === '1/CM' || t === 'CM-1' || t === 'CM^-1') return 'cm-1';
  if (t === 'MICROMETERS' || t === 'UM') return 'um';
  if (t === 'EV') return 'eV';
  return undefined;
}

function jcampYUnit(s: string): YUnit | undefined {
  const t = s.trim().toUpperCase();
  if (t === 'ABSORBANCE') return 'absorbance';
  if (t === 'TRANSMITTANCE' || t === '%T' || t === 'PERCENT TRANSMITTANCE') return 'percent-transmittance';
  if (t === 'COUNTS' || t === 'ARBITRARY UNITS' || t === 'INTENSITY' || t === 'EMISSION') return 'counts';
  return undefined;
}
