import Papa from 'papaparse';
import { SpectrumFileError } from '../errors';
import type { ParseOptions, XUnit, YUnit, Technique } from '../types';
import { isNonFiniteWord, parseNumberCell } from './parseNumberCell';
import { detectTechniqueFromName, detectXUnit, detectYUnit, yUnitForTechnique } from './detectUnits';

type Delimiter = ',' | ';' | '\t' | 'whitespace';

export interface DelimitedResult {
  x: number[];
  y: number[];
  lines: number[];
  xUnit: XUnit;
  yUnit: YUnit;
  columnName: string;
  columnIndex: number;
  availableColumns: string[];
  metadata: Record<string, string>;
  techniqueHint?: Technique;
  warnings: string[];
}

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

function isBlank(row: string[]): boolean {
  for (const c of row) if (c.length > 0) return false;
  return true;
}

function isDataRow(row: string[], decimalComma: boolean): boolean {
  if (row.length < 2) return false;
  const x = parseNumberCell(row[0]!, decimalComma);
  if (x === undefined || Number.isNaN(x)) return false;
  for (let i = 1; i < row.length; i++) {
    const v = parseNumberCell(row[i]!, decimalComma);
    if (v !== undefined && !Number.isNaN(v)) return true;
  }
  return false;
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
      if (numericCount(cells, decimalComma) >= 2 && isDataRow(cells.map((c) => c.trim()), decimalComma)) score++;
    }
    if (score > best.score) best = { delimiter, decimalComma, score };
  }
  return { delimiter: best.delimiter, decimalComma: best.decimalComma };
}

function addMetadata(metadata: Record<string, string>, row: string[]): void {
  const cells = row.filter((c) => c.length > 0);
  if (cells.length === 0) return;
  const joined = cells.join(' ').trim();
  const kv = /^([^:=]{1,80}?)\s*[:=]\s*(.*)$/.exec(joined);
  let key: string;
  let value: string;
  if (kv) {
    key = kv[1]!.trim();
    value = kv[2]!.trim();
  } else if (cells.length >= 2) {
    key = cells[0]!;
    value = cells.slice(1).join(' ');
  } else {
    key = joined;
    value = '';
  }
  if (key.length === 0 || Object.keys(metadata).length >= 500) return;
  if (!(key in metadata)) metadata[key] = value.slice(0, 1000);
}

/**
 * Parses delimited text exports (comma, semicolon, tab or whitespace separated; decimal point or
 * decimal comma) with metadata lines before the header and after the data. One X column (the
 * first) and one or more Y columns. Units come from the header, the metadata, the options or the
 * technique; a file whose units cannot be known is rejected.
 */
export function parseDelimitedText(fileName: string, lines: string[], options: ParseOptions): DelimitedResult {
  const warnings: string[] = [];
  const { delimiter, decimalComma } = detectLayout(lines);
  const rows = splitRows(lines, delimiter);
  // data block: first run of 3 data rows
  let start = -1;
  for (let i = 0; i + 2 < rows.length || (i < rows.length && rows.length < 3); i++) {
    if (isDataRow(rows[i]!, decimalComma) && (i + 1 >= rows.length || isDataRow(rows[i + 1]!, decimalComma)) && (i + 2 >= rows.length || isDataRow(rows[i + 2]!, decimalComma))) {
      start = i;
      break;
    }
  }
  if (start < 0) {
    // is there any numeric line at all?
    const anyNumeric = rows.some((r) => isDataRow(r, decimalComma));
    if (!anyNumeric) {
      for (let i = 0; i < rows.length; i++) {
        const r = rows[i]!;
        if (r.length >= 2 && r.some((c) => isNonFiniteWord(c))) {
          throw new SpectrumFileError(fileName, 'value is not finite (NaN or infinity)', { line: i + 1 });
        }
      }
      throw new SpectrumFileError(fileName, 'no numeric data found (expected an X column followed by Y columns)');
    }
    throw new SpectrumFileError(fileName, 'fewer than 3 consecutive data rows found, at least 16 points are needed');
  }
  let end = start;
  const xOfRow: number[] = [];
  while (end < rows.length && !isBlank(rows[end]!)) {
    const r = rows[end]!;
    const xv = parseNumberCell(r[0] ?? '', decimalComma);
    if (xv === undefined || Number.isNaN(xv)) break;
    xOfRow.push(xv);
    end++;
  }
  // Does numeric data resume after the stop? Then the stop is damage, not a footer.
  const width = rows[start]!.length;
  for (let i = end + 1; i + 2 < rows.length; i++) {
    if (
      rows[i]!.length === width &&
      isDataRow(rows[i]!, decimalComma) &&
      isDataRow(rows[i + 1]!, decimalComma) &&
      isDataRow(rows[i + 2]!, decimalComma)
    ) {
      const cell = rows[end]![0] ?? '';
      if (isBlank(rows[end]!)) {
        throw new SpectrumFileError(fileName, `blank line inside the data (data resumes at line ${i + 1})`, { line: end + 1 });
      }
      const problem = isNonFiniteWord(cell) ? `X value "${cell}" is not finite` : `X value "${cell.slice(0, 40)}" is not a number`;
      throw new SpectrumFileError(fileName, problem, { line: end + 1, column: 1 });
    }
  }
  // header: the line just before the data, when it has text cells
  let header: string[] | undefined;
  let headerIndex = -1;
  if (start > 0) {
    const h = rows[start - 1]!;
    if (!isBlank(h) && h.length >= 2 && numericCount(h, decimalComma) < h.length) {
      header = h;
      headerIndex = start - 1;
    }
  }
  const metadata: Record<string, string> = {};
  for (let i = 0; i < (headerIndex >= 0 ? headerIndex : start); i++) addMetadata(metadata, rows[i]!);
  let footerLines = 0;
  for (let i = end; i < rows.length; i++) {
    if (!isBlank(rows[i]!)) {
      footerLines++;
      addMetadata(metadata, rows[i]!);
    }
  }
  if (footerLines > 0) warnings.push(`${footerLines} non-data line(s) after the data (from line ${end + 1}) were read as metadata`);

  const nCols = Math.max(width, header?.length ?? 0);
  const names: string[] = [];
  for (let c = 0; c < nCols; c++) {
    const h = header?.[c]?.trim();
    names.push(h && h.length > 0 ? h : `column ${c + 1}`);
  }
  // Y columns that hold numbers in the data block
  const yCols: number[] = [];
  for (let c = 1; c < nCols; c++) {
    for (let i = start; i < end; i++) {
      const v = parseNumberCell(rows[i]![c] ?? '', decimalComma);
      if (v !== undefined) {
        yCols.push(c);
        break;
      }
    }
  }
  if (yCols.length === 0) throw new SpectrumFileError(fileName, 'no Y column with values found', { line: start + 1 });
  let col: number;
  const want = options.column;
  if (want === undefined) col = yCols[0]!;
  else {
    const byName = typeof want === 'string' ? names.findIndex((n, i) => i > 0 && n === want) : -1;
    const byNameCi = typeof want === 'string' && byName < 0 ? names.findIndex((n, i) => i > 0 && n.toLowerCase() === want.trim().toLowerCase()) : -1;
    if (byName > 0) col = byName;
    else if (byNameCi > 0) col = byNameCi;
    else if (typeof want === 'number' || /^\d+$/.test(String(want).trim())) {
      col = Number(want);
      if (!Number.isInteger(col) || col < 1 || col >= nCols) {
        throw new SpectrumFileError(
          fileName,
          `column index ${want} is out of range: Y columns are 1..${nCols - 1} (0 is the X column)`,
          { column: Number(want) },
        );
      }
    } else {
      throw new SpectrumFileError(fileName, `no column named "${want}" (columns: ${names.slice(1).join(', ')})`, { column: String(want) });
    }
  }
  const columnName = names[col]!;

  const x: number[] = [];
  const y: number[] = [];
  const lineNos: number[] = [];
  let missing = 0;
  for (let i = start; i < end; i++) {
    const r = rows[i]!;
    const xv = xOfRow[i - start]!;
    const cell = r[col] ?? '';
    const yv = parseNumberCell(cell, decimalComma);
    if (yv === undefined) {
      missing++;
      continue;
    }
    if (Number.isNaN(yv)) {
      const problem = isNonFiniteWord(cell) ? `value "${cell}" is not finite` : `value "${cell.slice(0, 40)}" is not a number`;
      throw new SpectrumFileError(fileName, problem, { line: i + 1, column: columnName });
    }
    if (!Number.isFinite(xv)) throw new SpectrumFileError(fileName, 'X value is not finite', { line: i + 1, column: names[0]! });
    x.push(xv);
    y.push(yv);
    lineNos.push(i + 1);
  }
  if (missing > 0) {
    if (x.length === 0) throw new SpectrumFileError(fileName, 'column has no values', { column: columnName });
    warnings.push(`column "${columnName}": ${missing} empty cell(s) skipped; ${x.length} points kept`);
  }

  // units
  const metaText = Object.entries(metadata).map(([k, v]) => `${k} ${v}`).join('\n');
  const xUnit = options.xUnit ?? detectXUnit(names[0]!) ?? detectXUnit(metaText);
  if (!xUnit) {
    throw new SpectrumFileError(fileName, 'X unit unknown: the header does not say nm, µm, cm-1 or eV; choose the X unit', {
      column: names[0]!,
    });
  }
  const nameHint = detectTechniqueFromName(fileName);
  const yUnit =
    options.yUnit ??
    detectYUnit(columnName) ??
    (header ? detectYUnit(header.join(' ')) : undefined) ??
    detectYUnit(metaText) ??
    (options.technique ? yUnitForTechnique(options.technique) : undefined) ??
    (nameHint ? yUnitForTechnique(nameHint) : undefined);
  if (!yUnit) {
    throw new SpectrumFileError(
      fileName,
      'Y unit unknown: neither the header nor the file says absorbance, %T or counts; choose the Y unit or technique',
      { column: columnName },
    );
  }
  if (!options.yUnit && !detectYUnit(columnName) && !(header && detectYUnit(header.join(' '))) && !detectYUnit(metaText)) {
    warnings.push(`Y unit "${yUnit}" inferred from the ${options.technique ? 'chosen technique' : 'file name'}`);
  }
  const out: DelimitedResult = {
    x,
    y,
    lines: lineNos,
    xUnit,
    yUnit,
    columnName,
    columnIndex: col,
    availableColumns: yCols.map((c) => names[c]!),
    metadata,
    warnings,
  };
  if (nameHint) out.techniqueHint = nameHint;
  return out;
}
