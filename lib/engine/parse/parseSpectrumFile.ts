import { SpectrumFileError } from '../errors';
import type { ParseOptions, ParsedSpectrum, Technique, TraceInfo } from '../types';
import { decodeText } from './decodeText';
import { parseDelimitedText } from './parseDelimitedText';
import { parseJcampText } from './parseJcampText';
import { finalizeSpectrum } from './finalizeSpectrum';
import { guessTechnique } from './detectUnits';
import { readMetadataNumbers } from './readMetadataNumbers';
import { looksLikeSpreadsheet } from './looksLikeSpreadsheet';
import type { TableResult } from './parseTableRows';

/** Default size limit, bytes (20 MiB). */
export const DEFAULT_MAX_BYTES = 20 * 1024 * 1024;
/** Default line-length limit, characters (1 MiB). */
export const DEFAULT_MAX_LINE_LENGTH = 1024 * 1024;
/** Default smallest number of points. */
export const DEFAULT_MIN_POINTS = 16;

export interface CheckedLimits {
  maxBytes: number;
  maxLineLength: number;
  minPoints: number;
}

export function checkedLimits(fileName: unknown, bytes: unknown, options: ParseOptions): CheckedLimits {
  if (typeof fileName !== 'string') throw new TypeError('fileName must be a string');
  if (!(bytes instanceof Uint8Array)) throw new TypeError('bytes must be a Uint8Array');
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  const maxLineLength = options.maxLineLength ?? DEFAULT_MAX_LINE_LENGTH;
  const minPoints = options.minPoints ?? DEFAULT_MIN_POINTS;
  if (!(maxBytes > 0)) throw new RangeError('maxBytes must be positive');
  if (!(maxLineLength > 0)) throw new RangeError('maxLineLength must be positive');
  if (!(minPoints >= 3)) throw new RangeError('minPoints must be at least 3');
  return { maxBytes, maxLineLength, minPoints };
}

/**
 * Turns a table read from text or a spreadsheet into one spectrum: checks and sorts the points,
 * guesses the technique, reads path length and excitation from the metadata.
 */
export function spectrumFromTable(
  fileName: string,
  table: TableResult,
  meta: { format: ParsedSpectrum['format']; encoding: string; minPoints: number; technique?: Technique; sheet?: string; sheets?: string[] },
): ParsedSpectrum {
  const ln = table.lines;
  const fin = finalizeSpectrum(fileName, table.x, table.y, {
    minPoints: meta.minPoints,
    requirePositiveX: true,
    columnName: table.columnName,
    lineOf: (i: number) => ln[i],
  });
  const technique = guessTechnique(table.xUnit, table.yUnit, meta.technique ?? table.techniqueHint);
  return withMetadataNumbers(fileName, {
    fileName,
    format: meta.format,
    encoding: meta.encoding,
    layout: table.layout,
    xUnitSource: table.xUnitSource,
    traces: table.traces,
    block: table.block,
    ...(table.pair !== undefined ? { pair: table.pair } : {}),
    ...(meta.sheet !== undefined ? { sheet: meta.sheet } : {}),
    ...(meta.sheets !== undefined ? { sheets: meta.sheets } : {}),
    x: fin.x,
    y: fin.y,
    xUnit: table.xUnit,
    yUnit: table.yUnit,
    xOrderInFile: fin.order,
    technique,
    columnName: table.columnName,
    columnIndex: table.columnIndex,
    availableColumns: table.availableColumns,
    metadata: table.metadata,
    warnings: [...table.warnings, ...fin.warnings],
  });
}

function withMetadataNumbers(fileName: string, out: ParsedSpectrum): ParsedSpectrum {
  const nums = readMetadataNumbers(out.metadata, fileName);
  if (nums.excitationFromName) out.warnings.push(`excitation ${nums.excitationNm} nm read from the file name`);
  if (nums.pathLengthCm !== undefined) out.pathLengthCm = nums.pathLengthCm;
  if (nums.excitationNm !== undefined) out.excitationNm = nums.excitationNm;
  return out;
}

/**
 * Turns the bytes of an uploaded text file into one spectrum: delimited text (CSV, semicolon, tab,
 * whitespace; decimal point or comma; UTF-8, UTF-16 or a single-byte Western encoding) or
 * JCAMP-DX. Spreadsheets need the asynchronous parseSpectrumBytes. Throws SpectrumFileError,
 * whose one-line message names the file, the line or column when known, and the problem. Never
 * returns a partial result silently: anything skipped is listed in `warnings`.
 */
export function parseSpectrumFile(fileName: string, bytes: Uint8Array, options: ParseOptions = {}): ParsedSpectrum {
  const { maxBytes, maxLineLength, minPoints } = checkedLimits(fileName, bytes, options);
  if (looksLikeSpreadsheet(fileName, bytes)) {
    throw new SpectrumFileError(fileName, 'is a spreadsheet (.xlsx); it is read with the spreadsheet reader (parseSpectrumBytes)');
  }
  const { lines, text, encoding } = decodeText(fileName, bytes, { maxBytes, maxLineLength });
  const isJcamp = /^\s*##\s*TITLE\s*=/i.test(text) || (/\.(jdx|dx|jcamp)$/i.test(fileName) && /^\s*##/.test(text));
  if (!isJcamp) {
    const table = parseDelimitedText(fileName, lines, options);
    return spectrumFromTable(fileName, table, {
      format: 'delimited',
      encoding,
      minPoints,
      ...(options.technique ? { technique: options.technique } : {}),
    });
  }
  const base = parseJcampText(fileName, text, options);
  const fin = finalizeSpectrum(fileName, base.x, base.y, { minPoints, requirePositiveX: true, columnName: base.columnName });
  const traces: TraceInfo[] = base.availableColumns.map((name, i) => ({ block: i + 1, column: i + 1, xColumn: 0, name, label: name }));
  return withMetadataNumbers(fileName, {
    fileName,
    format: 'jcamp-dx',
    encoding,
    layout: 'x-then-y',
    xUnitSource: options.xUnit ? 'chosen' : 'file',
    traces,
    block: 1,
    x: fin.x,
    y: fin.y,
    xUnit: base.xUnit,
    yUnit: base.yUnit,
    xOrderInFile: fin.order,
    technique: guessTechnique(base.xUnit, base.yUnit, options.technique),
    columnName: base.columnName,
    columnIndex: base.columnIndex,
    availableColumns: base.availableColumns,
    metadata: base.metadata,
    warnings: [...base.warnings, ...fin.warnings],
  });
}

export { SpectrumFileError };
