import Papa from 'papaparse';
import type { ParseOptions } from '../types';
import { parseNumberCell } from './parseNumberCell';
import { isDataRow, parseTableRows, type TableResult } from './parseTableRows';

type Delimiter = ',' | ';' | '\t' | 'whitespace';

function splitRows(lines: string[], delimiter: Delimiter): string[][] {
  if (delimiter === 'whitespace') return lines.map((l) => (l.trim().length === 0 ? [] : l.trim().split(/\s+/)));
  // Without a quote character, delimited text is a plain split on the delimiter (RFC 4180 §2);
  // the CSV parser is needed only for quoted cells, and costs several times more.
  if (!lines.some((l) => l.includes('"'))) return lines.map((l) => l.split(delimiter).map((c) => c.trim()));
  const parsed = Papa.parse<string[]>(lines.join('\n'), { delimiter, newline: '\n', quoteChar: '"', skipEmptyLines: false });
  const rows = parsed.data;
  if (rows.length !== lines.length) {
    // a quoted cell spanning lines would shift line numbers; fall back to a plain split
    return lines.map((l) => l.split(delimiter));
  }
  return rows.map((r) => r.map((c) => c.trim()));
}

function numericCount(row: string[], decimalComma: boolean): number {
  let k = 0;
  for (const c of row) {
    const v = parseNumberCell(c, decimalComma);
    if (v !== undefined && !Number.isNaN(v)) k++;
  }
  return k;
}

/** Picks the separator and decimal mark that turn the most lines into all-numeric rows of ≥ 2 cells. */
function detectLayout(lines: string[]): { delimiter: Delimiter; decimalComma: boolean } {
  const sample: string[] = [];
  // Up to ~120 lines spread over the file decide it: enough for the data block to outvote
  // headers and footers, and a long file does not cost more to sniff than a short one.
  const step = Math.max(1, Math.floor(lines.length / 120));
  for (let i = 0; i < lines.length; i += step) if (lines[i]!.trim().length > 0) sample.push(lines[i]!);
  let best = { delimiter: ',' as Delimiter, decimalComma: false, score: -1 };
  const candidates: Array<[Delimiter, boolean]> = [
    ['\t', false],
    ['\t', true],
    [';', false],
    [';', true],
    [',', false],
    ['whitespace', false],
    ['whitespace', true],
  ];
  for (const [delimiter, decimalComma] of candidates) {
    let score = 0;
    for (const line of sample) {
      const cells = delimiter === 'whitespace' ? line.trim().split(/\s+/) : line.split(delimiter);
      if (cells.length < 2) continue;
      if (
        numericCount(cells, decimalComma) >= 2 &&
        isDataRow(
          cells.map((c) => c.trim()),
          decimalComma,
        )
      )
        score++;
    }
    if (score > best.score) best = { delimiter, decimalComma, score };
  }
  return { delimiter: best.delimiter, decimalComma: best.decimalComma };
}

/**
 * Parses delimited text exports (comma, semicolon, tab or whitespace separated; decimal point or
 * decimal comma): the separator and decimal mark are sniffed, then the rows are read as a table
 * (parseTableRows: metadata, blocks, group headers, X then Y columns or X,Y pairs).
 */
export function parseDelimitedText(fileName: string, lines: string[], options: ParseOptions): TableResult {
  const { delimiter, decimalComma } = detectLayout(lines);
  return parseTableRows(fileName, splitRows(lines, delimiter), decimalComma, options);
}
