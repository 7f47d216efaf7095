import { SpectrumFileError } from '../errors';
import type { ParseOptions, ParsedSpectrum, Technique } from '../types';
import { decodeText } from './decodeText';
import { parseDelimitedText } from './parseDelimitedText';
import { parseJcampText } from './parseJcampText';
import { finalizeSpectrum } from './finalizeSpectrum';
import { guessTechnique } from './detectUnits';
import { readMetadataNumbers } from './readMetadataNumbers';

/** Default size limit, bytes (20 MiB). */
export const DEFAULT_MAX_BYTES = 20 * 1024 * 1024;
/** Default line-length limit, characters (1 MiB). */
export const DEFAULT_MAX_LINE_LENGTH = 1024 * 1024;
/** Default smallest number of points. */
export const DEFAULT_MIN_POINTS = 16;

/**
 * Turns the bytes of an uploaded file into one spectrum: delimited text (CSV, semicolon, tab,
 * whitespace; decimal point or comma) or JCAMP-DX. Throws SpectrumFileError, whose one-line
 * message names the file, the line or column when known, and the problem. Never returns a partial
 * result silently: anything skipped is listed in `warnings`.
 */
export function parseSpectrumFile(fileName: string, bytes: Uint8Array, options: ParseOptions = {}): ParsedSpectrum {
  if (typeof fileName !== 'string') throw new TypeError('fileName must be a string');
  if (!(bytes instanceof Uint8Array)) throw new TypeError('bytes must be a Uint8Array');
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  const maxLineLength = options.maxLineLength ?? DEFAULT_MAX_LINE_LENGTH;
  const minPoints = options.minPoints ?? DEFAULT_MIN_POINTS;
  if (!(maxBytes > 0)) throw new RangeError('maxBytes must be positive');
  if (!(maxLineLength > 0)) throw new RangeError('maxLineLength must be positive');
  if (!(minPoints >= 3)) throw new RangeError('minPoints must be at least 3');
  const { lines, text } = decodeText(fileName, bytes, { maxBytes, maxLineLength });
  const isJcamp = /^\s*##\s*TITLE\s*=/i.test(text) || (/\.(jdx|dx|jcamp)$/i.test(fileName) && /^\s*##/.test(text));
  let techniqueHint: Technique | undefined = options.technique;
  let base;
  let lineOf: ((i: number) => number | undefined) | undefined;
  if (isJcamp) {
    base = parseJcampText(fileName, text, options);
  } else {
    const r = parseDelimitedText(fileName, lines, options);
    base = r;
    const ln = r.lines;
    lineOf = (i: number) => ln[i];
    techniqueHint = techniqueHint ?? r.techniqueHint;
  }
  const fin = finalizeSpectrum(fileName, base.x, base.y, {
    minPoints,
    requirePositiveX: base.xUnit !== 'eV' || true,
    columnName: base.columnName,
    ...(lineOf ? { lineOf } : {}),
  });
  const technique = guessTechnique(base.xUnit, base.yUnit, techniqueHint);
  const warnings = [...base.warnings, ...fin.warnings];
  const nums = readMetadataNumbers(base.metadata, fileName);
  if (nums.excitationFromName) warnings.push(`excitation ${nums.excitationNm} nm read from the file name`);
  const out: ParsedSpectrum = {
    fileName,
    format: isJcamp ? 'jcamp-dx' : 'delimited',
    x: fin.x,
    y: fin.y,
    xUnit: base.xUnit,
    yUnit: base.yUnit,
    xOrderInFile: fin.order,
    technique,
    columnName: base.columnName,
    columnIndex: base.columnIndex,
    availableColumns: base.availableColumns,
    metadata: base.metadata,
    warnings,
  };
  if (nums.pathLengthCm !== undefined) out.pathLengthCm = nums.pathLengthCm;
  if (nums.excitationNm !== undefined) out.excitationNm = nums.excitationNm;
  return out;
}

export { SpectrumFileError };
