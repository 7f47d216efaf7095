import { SpectrumFileError } from '../errors';

export interface DecodeOptions {
  maxBytes: number;
  maxLineLength: number;
}

/**
 * Checks the raw bytes (size, emptiness, binary content), decodes them as UTF-8 (falling back to
 * Latin-1 when the bytes are not valid UTF-8), drops a byte-order mark and splits the text into
 * lines on LF, CRLF or lone CR. Rejects lines longer than `maxLineLength`.
 */
export function decodeText(fileName: string, bytes: Uint8Array, options: DecodeOptions): { lines: string[]; text: string } {
  if (!(bytes instanceof Uint8Array)) throw new TypeError('bytes must be a Uint8Array');
  if (bytes.length > options.maxBytes) {
    throw new SpectrumFileError(
      fileName,
      `file is ${bytes.length} bytes, over the ${options.maxBytes}-byte limit`,
    );
  }
  if (bytes.length === 0) throw new SpectrumFileError(fileName, 'file is empty');
  const probe = Math.min(bytes.length, 65536);
  let control = 0;
  for (let i = 0; i < probe; i++) {
    const b = bytes[i]!;
    if (b === 0) throw new SpectrumFileError(fileName, 'file looks binary (contains NUL bytes), expected a text export');
    if (b < 32 && b !== 9 && b !== 10 && b !== 13 && b !== 12) control++;
  }
  if (control > probe * 0.01) {
    throw new SpectrumFileError(fileName, 'file looks binary (control characters), expected a text export');
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    text = new TextDecoder('latin1').decode(bytes);
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
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
  return { lines, text };
}
