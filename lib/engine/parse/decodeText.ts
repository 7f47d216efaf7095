import iconv from 'iconv-lite';
import jschardet from 'jschardet';
import { SpectrumFileError } from '../errors';

export interface DecodeOptions {
  maxBytes: number;
  maxLineLength: number;
}

/** Text encodings the reader decodes; the name is recorded on the parsed spectrum. */
export type TextEncoding = 'utf-8' | 'utf-8-bom' | 'utf-16le' | 'utf-16be' | 'windows-1252' | 'iso-8859-1' | 'iso-8859-15';

/** Single-byte encodings accepted from the detector; anything else falls back to windows-1252. */
const SINGLE_BYTE: Record<string, TextEncoding> = {
  'windows-1252': 'windows-1252',
  'iso-8859-1': 'iso-8859-1',
  'iso-8859-15': 'iso-8859-15',
};
/** Below this confidence the detector's guess is not trusted (it guesses wildly on short, mostly-ASCII text). */
const DETECTOR_MIN_CONFIDENCE = 0.5;

function startsWith(bytes: Uint8Array, prefix: number[]): boolean {
  return prefix.every((b, i) => bytes[i] === b);
}

/**
 * Picks the encoding: a byte-order mark decides (UTF-8, UTF-16 LE/BE); otherwise valid UTF-8 is
 * UTF-8; otherwise a single-byte Western encoding (jschardet's guess when confident, else
 * windows-1252, whose printable range is a superset of Latin-1's).
 */
function chooseEncoding(bytes: Uint8Array): TextEncoding {
  if (startsWith(bytes, [0xef, 0xbb, 0xbf])) return 'utf-8-bom';
  if (startsWith(bytes, [0xff, 0xfe])) return 'utf-16le';
  if (startsWith(bytes, [0xfe, 0xff])) return 'utf-16be';
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    return 'utf-8';
  } catch {
    const probe = Buffer.from(bytes.buffer, bytes.byteOffset, Math.min(bytes.length, 65536));
    const guess = jschardet.detect(probe);
    const name = guess.encoding?.toLowerCase() ?? '';
    const known = SINGLE_BYTE[name];
    return known && guess.confidence >= DETECTOR_MIN_CONFIDENCE ? known : 'windows-1252';
  }
}

function decodeWith(bytes: Uint8Array, encoding: TextEncoding): string {
  const buffer = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.length);
  switch (encoding) {
    case 'utf-8':
      return buffer.toString('utf8');
    case 'utf-8-bom':
      return buffer.subarray(3).toString('utf8');
    case 'utf-16le':
    case 'utf-16be':
      // iconv-lite drops the byte-order mark itself (stripBOM defaults to true).
      return iconv.decode(buffer, encoding);
    default:
      return iconv.decode(buffer, encoding);
  }
}

/** Share of characters that are control characters other than tab, LF, CR, FF (0 for plain text). */
function controlShare(text: string, upTo: number): { nul: boolean; share: number } {
  const n = Math.min(text.length, upTo);
  let control = 0;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c === 0) return { nul: true, share: 1 };
    if ((c < 32 && c !== 9 && c !== 10 && c !== 13 && c !== 12) || c === 0xfffd || (c >= 0xd800 && c <= 0xdfff)) control++;
  }
  return { nul: false, share: n === 0 ? 0 : control / n };
}

/**
 * Checks the raw bytes (size, emptiness, binary content), decodes them (see chooseEncoding),
 * and splits the text into lines on LF, CRLF or lone CR. Rejects lines longer than
 * `maxLineLength`. A file that starts like UTF-16 but does not decode to text is refused as
 * binary with the reason.
 */
export function decodeText(
  fileName: string,
  bytes: Uint8Array,
  options: DecodeOptions,
): { lines: string[]; text: string; encoding: TextEncoding } {
  if (!(bytes instanceof Uint8Array)) throw new TypeError('bytes must be a Uint8Array');
  if (bytes.length > options.maxBytes) {
    throw new SpectrumFileError(fileName, `file is ${bytes.length} bytes, over the ${options.maxBytes}-byte limit`);
  }
  if (bytes.length === 0) throw new SpectrumFileError(fileName, 'file is empty');
  const encoding = chooseEncoding(bytes);
  const utf16 = encoding === 'utf-16le' || encoding === 'utf-16be';
  if (utf16 && bytes.length % 2 === 1) {
    throw new SpectrumFileError(
      fileName,
      'file starts like UTF-16 text but has an odd number of bytes; it looks binary, export it again as text (CSV)',
    );
  }
  const text = decodeWith(bytes, encoding);
  const { nul, share } = controlShare(text, 65536);
  if (nul || share > 0.01) {
    const problem = utf16
      ? 'file starts like UTF-16 text but does not decode to text (it looks binary); export it again as text (CSV)'
      : nul
        ? 'file looks binary (contains NUL bytes), expected a text export'
        : 'file looks binary (control characters), expected a text export';
    throw new SpectrumFileError(fileName, problem);
  }
  if (text.trim().length === 0) throw new SpectrumFileError(fileName, 'file is empty (only whitespace)');
  const lines = text.split(/\r\n|\n|\r/);
  for (let i = 0; i < lines.length; i++) {
    if (lines[i]!.length > options.maxLineLength) {
      throw new SpectrumFileError(
        fileName,
        `line is ${lines[i]!.length} characters long, over the ${options.maxLineLength}-character limit`,
        { line: i + 1 },
      );
    }
  }
  return { lines, text, encoding };
}
