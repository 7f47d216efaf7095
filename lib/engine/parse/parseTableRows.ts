import { SpectrumFileError } from '../errors';
import type { ParseOptions, TableLayout, TraceInfo, UnitSource, XUnit, YUnit, Technique } from '../types';
import { isNonFiniteWord, parseNumberCell } from './parseNumberCell';
import { detectTechniqueFromName, detectXUnit, detectYUnit, yUnitForTechnique } from './detectUnits';
import { inferXUnit } from './inferXUnit';
import { readSeriesValue } from './readSeriesValue';

export interface TableResult {
  x: number[];
  y: number[];
  /** 1-based file line (or sheet row) of each point. */
  lines: number[];
  xUnit: XUnit;
  xUnitSource: UnitSource;
  yUnit: YUnit;
  columnName: string;
  columnIndex: number;
  availableColumns: string[];
  metadata: Record<string, string>;
  techniqueHint?: Technique;
  layout: TableLayout;
  traces: TraceInfo[];
  block: number;
  pair?: number;
  warnings: string[];
}

/** One block of data: its rows [start, end), header row and optional group-header row (indexes into rows). */
interface Block {
  start: number;
  end: number;
  headerIndex: number;
  groupIndex: number;
  width: number;
  names: string[];
  groups: string[];
  pairs: boolean;
  yColumns: number[];
}

const isBlank = (row: string[]) => row.every((c) => c.length === 0);
const numeric = (cell: string | undefined, dc: boolean) => {
  const v = parseNumberCell(cell ?? '', dc);
  return v !== undefined && !Number.isNaN(v);
};

function numericCount(row: string[], dc: boolean): number {
  let k = 0;
  for (const c of row) if (numeric(c, dc)) k++;
  return k;
}

export function isDataRow(row: string[], dc: boolean): boolean {
  if (row.length < 2 || !numeric(row[0], dc)) return false;
  for (let i = 1; i < row.length; i++) if (numeric(row[i], dc)) return true;
  return false;
}

const runStartsAt = (rows: string[][], i: number, dc: boolean) =>
  isDataRow(rows[i]!, dc) && (i + 1 >= rows.length || isDataRow(rows[i + 1]!, dc)) && (i + 2 >= rows.length || isDataRow(rows[i + 2]!, dc));

/** A header row: at least two cells, at least one of them text. */
const isHeaderRow = (row: string[] | undefined, dc: boolean) =>
  row !== undefined &&
  !isBlank(row) &&
  row.filter((c) => c.length > 0).length >= 2 &&
  numericCount(row, dc) < row.filter((c) => c.length > 0).length;

const KEY_VALUE = /^[^:=]{1,80}[:=]/;

/**
 * A line of group names above the column names: fewer names than columns, none of them a number
 * or "key: value"; two or more names, or one that does not stand in the first cell (a metadata
 * line starts there).
 */
function isGroupRow(row: string[] | undefined, header: string[], dc: boolean): boolean {
  if (!row || isBlank(row)) return false;
  const filled = row.map((c, i) => [c, i] as const).filter(([c]) => c.length > 0);
  if (filled.length >= header.filter((c) => c.length > 0).length) return false;
  if (filled.length === 1 && filled[0]![1] === 0) return false;
  if (filled.some(([c]) => KEY_VALUE.test(c) || numeric(c, dc))) return false;
  return filled.every(([, i]) => i < header.length);
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

function columnValues(rows: string[][], b: { start: number; end: number }, c: number, dc: boolean): number[] {
  const out: number[] = [];
  for (let i = b.start; i < b.end; i++) {
    const v = parseNumberCell(rows[i]![c] ?? '', dc);
    if (v !== undefined && !Number.isNaN(v)) out.push(v);
  }
  return out;
}

function strictlyMonotonic(v: number[]): boolean {
  if (v.length < 3) return false;
  const up = v[1]! > v[0]!;
  for (let i = 1; i < v.length; i++) if (up ? !(v[i]! > v[i - 1]!) : !(v[i]! < v[i - 1]!)) return false;
  return true;
}

/**
 * X,Y pairs side by side: an even number of columns (≥ 4) where every even column is strictly
 * monotonic and overlaps the first column's range by at least half of the narrower range (a Y
 * column that happens to be monotonic lies far from the X range), or names the same X unit.
 */
function looksLikePairs(rows: string[][], b: { start: number; end: number; width: number }, names: string[], dc: boolean): boolean {
  if (b.width < 4 || b.width % 2 === 1) return false;
  const x0 = columnValues(rows, b, 0, dc);
  if (!strictlyMonotonic(x0)) return false;
  const lo0 = Math.min(...x0);
  const hi0 = Math.max(...x0);
  for (let c = 2; c < b.width; c += 2) {
    const xc = columnValues(rows, b, c, dc);
    if (!strictlyMonotonic(xc)) return false;
    const sameUnit = detectXUnit(names[c] ?? '') !== undefined && detectXUnit(names[c] ?? '') === detectXUnit(names[0] ?? '');
    const lo = Math.min(...xc);
    const hi = Math.max(...xc);
    const overlap = Math.min(hi, hi0) - Math.max(lo, lo0);
    if (!sameUnit && overlap < 0.5 * Math.min(hi - lo, hi0 - lo0)) return false;
  }
  return true;
}

/** Ends the data run that starts at `start`: the first blank row or row whose first cell is not a number. */
function dataEnd(rows: string[][], start: number, dc: boolean): number {
  let end = start;
  while (end < rows.length && !isBlank(rows[end]!) && numeric(rows[end]![0], dc)) end++;
  return end;
}

function damage(fileName: string, rows: string[][], end: number, resume: number): SpectrumFileError {
  if (isBlank(rows[end]!))
    return new SpectrumFileError(fileName, `blank line inside the data (data resumes at line ${resume + 1})`, { line: end + 1 });
  const cell = rows[end]![0] ?? '';
  const problem = isNonFiniteWord(cell) ? `X value "${cell}" is not finite` : `X value "${cell.slice(0, 40)}" is not a number`;
  return new SpectrumFileError(fileName, problem, { line: end + 1, column: 1 });
}

/**
 * Finds the data blocks: runs of ≥ 3 rows whose first cell is a number. A later run is a block
 * of its own only when a header row stands right above it; a later run of the same width
 * without a header means the data were damaged (a blank or non-numeric row inside them).
 */
function findBlocks(fileName: string, rows: string[][], dc: boolean): Array<{ start: number; end: number }> {
  const found: Array<{ start: number; end: number }> = [];
  let i = 0;
  while (i < rows.length) {
    if (!runStartsAt(rows, i, dc)) {
      i++;
      continue;
    }
    const start = i;
    const end = dataEnd(rows, start, dc);
    found.push({ start, end });
    const width = rows[start]!.length;
    let next = -1;
    for (let j = end + 1; j + 2 < rows.length; j++) {
      if (runStartsAt(rows, j, dc)) {
        next = j;
        break;
      }
    }
    if (next < 0) break;
    // A new block's header holds text only: a row like "x14,0.3" inside the data is damage, not a header.
    if (isHeaderRow(rows[next - 1], dc) && numericCount(rows[next - 1]!, dc) === 0 && next - 1 >= end) {
      i = next;
      continue;
    }
    if (rows[next]!.length === width) throw damage(fileName, rows, end, next);
    // A narrower or wider numeric run without a header is footer material (instrument logs).
    break;
  }
  return found;
}

function describeBlock(rows: string[][], b: { start: number; end: number }, previousEnd: number, dc: boolean): Block {
  const width = rows[b.start]!.length;
  let headerIndex = -1;
  let groupIndex = -1;
  if (b.start - 1 >= previousEnd && isHeaderRow(rows[b.start - 1], dc)) {
    headerIndex = b.start - 1;
    if (b.start - 2 >= previousEnd && isGroupRow(rows[b.start - 2], rows[headerIndex]!, dc)) groupIndex = b.start - 2;
  }
  const header = headerIndex >= 0 ? rows[headerIndex]! : [];
  const nCols = Math.max(width, header.length);
  const names: string[] = [];
  for (let c = 0; c < nCols; c++) {
    const h = header[c]?.trim();
    names.push(h && h.length > 0 ? h : `column ${c + 1}`);
  }
  const groups: string[] = [];
  const groupRow = groupIndex >= 0 ? rows[groupIndex]! : [];
  let current = '';
  for (let c = 0; c < nCols; c++) {
    const g = groupRow[c]?.trim() ?? '';
    if (g.length > 0) current = g;
    groups.push(current);
  }
  const yColumns: number[] = [];
  for (let c = 1; c < nCols; c++) {
    for (let i = b.start; i < b.end; i++) {
      if (parseNumberCell(rows[i]![c] ?? '', dc) !== undefined) {
        yColumns.push(c);
        break;
      }
    }
  }
  const block = { ...b, width: nCols };
  const pairs = looksLikePairs(rows, block, names, dc);
  return { ...block, headerIndex, groupIndex, names, groups, pairs, yColumns: pairs ? yColumns.filter((c) => c % 2 === 1) : yColumns };
}

function tracesOf(blocks: Block[]): TraceInfo[] {
  const traces: TraceInfo[] = [];
  const multi = blocks.length > 1;
  blocks.forEach((b, bi) => {
    for (const c of b.yColumns) {
      const group = b.groups[c] || (b.pairs ? b.groups[c - 1] : '') || '';
      const name = b.names[c]!;
      let label = group && group !== name ? `${group} / ${name}` : name;
      if (multi) label = `block ${bi + 1} / ${label}`;
      const t: TraceInfo = { block: bi + 1, column: c, xColumn: b.pairs ? c - 1 : 0, name, label };
      if (b.pairs) t.pair = (c + 1) / 2;
      if (group) t.group = group;
      const sv = readSeriesValue(name) ?? (group ? readSeriesValue(group) : undefined);
      if (sv) t.seriesValue = sv;
      traces.push(t);
    }
  });
  // Same labels (e.g. "Absorbance" under each pair with no group line) get their pair or column number.
  const counts = new Map<string, number>();
  for (const t of traces) counts.set(t.label, (counts.get(t.label) ?? 0) + 1);
  for (const t of traces)
    if (counts.get(t.label)! > 1) t.label = t.pair ? `${t.label} (pair ${t.pair})` : `${t.label} (column ${t.column + 1})`;
  return traces;
}

function chooseTrace(fileName: string, blocks: Block[], traces: TraceInfo[], options: ParseOptions): TraceInfo {
  const blockNo = options.block ?? 1;
  if (!Number.isInteger(blockNo) || blockNo < 1 || blockNo > blocks.length) {
    throw new SpectrumFileError(fileName, `block ${options.block} does not exist: the file holds ${blocks.length} block(s)`);
  }
  const inBlock = traces.filter((t) => t.block === blockNo);
  const b = blocks[blockNo - 1]!;
  if (inBlock.length === 0) throw new SpectrumFileError(fileName, 'no Y column with values found', { line: b.start + 1 });
  if (options.pair !== undefined) {
    if (!b.pairs)
      throw new SpectrumFileError(fileName, `the file has no X,Y pairs side by side; choose a column instead of pair ${options.pair}`);
    const t = inBlock.find((tr) => tr.pair === options.pair);
    if (!t) throw new SpectrumFileError(fileName, `pair ${options.pair} does not exist: pairs are 1..${inBlock.length}`);
    return t;
  }
  const want = options.column;
  if (want === undefined) return inBlock[0]!;
  if (typeof want === 'string' && !/^\d+$/.test(want.trim())) {
    const pool = options.block === undefined ? traces : inBlock;
    const exact = pool.find((t) => t.label === want || t.name === want);
    const w = want.trim().toLowerCase();
    const loose = exact ?? pool.find((t) => t.label.toLowerCase() === w || t.name.toLowerCase() === w);
    if (loose) return loose;
    throw new SpectrumFileError(fileName, `no column named "${want}" (columns: ${pool.map((t) => t.label).join(', ')})`, { column: want });
  }
  const index = Number(want);
  const hit = inBlock.find((t) => t.column === index);
  if (hit) return hit;
  if (b.pairs && Number.isInteger(index) && index >= 0 && index < b.width && index % 2 === 0) {
    const pair = index / 2 + 1;
    throw new SpectrumFileError(
      fileName,
      `column ${index} is the X column of pair ${pair} ("${b.names[index]}"); choose its Y column ${index + 1} or pair ${pair}`,
      { column: index },
    );
  }
  const range = b.pairs
    ? `Y columns are ${b.yColumns.join(', ')} (pairs ${b.yColumns.map((c) => `${(c + 1) / 2}: ${b.names[c]}`).join(', ')})`
    : `Y columns are 1..${b.width - 1} (0 is the X column)`;
  throw new SpectrumFileError(fileName, `column index ${want} is out of range: ${range}`, { column: index });
}

/** All unit tokens written in a header (not words like "wavelength", which only hint). */
function statedXUnits(text: string): Set<XUnit> {
  const found = new Set<XUnit>();
  const t = text.toLowerCase();
  if (/cm\s*(?:-1|⁻¹|\^-1|\^\{-1\})|1\s*\/\s*cm/.test(t)) found.add('cm-1');
  if (/\bnm\b/.test(t)) found.add('nm');
  if (/µm|μm|\bum\b/.test(t)) found.add('um');
  if (/\bev\b/.test(t)) found.add('eV');
  return found;
}

/**
 * Reads a table of text cells (from delimited text or a spreadsheet sheet): metadata lines,
 * one or more blocks, each with an optional group-header line and header, laid out as X then Y
 * columns or as X,Y pairs side by side. Picks one Y series (options.block / pair / column) and
 * settles the units: header text, then metadata, then the person's choice, then the values
 * (see inferXUnit); a file whose X unit stays ambiguous is refused with the candidates.
 */
export function parseTableRows(fileName: string, rows: string[][], decimalComma: boolean, options: ParseOptions): TableResult {
  const dc = decimalComma;
  const warnings: string[] = [];
  const spans = findBlocks(fileName, rows, dc);
  if (spans.length === 0) {
    const anyNumeric = rows.some((r) => isDataRow(r, dc));
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
  const blocks: Block[] = [];
  let previousEnd = 0;
  for (const s of spans) {
    blocks.push(describeBlock(rows, s, previousEnd, dc));
    previousEnd = s.end;
  }
  // metadata: everything that is not a block's data, header or group line
  const metadata: Record<string, string> = {};
  const used = new Set<number>();
  for (const b of blocks) {
    for (let i = b.start; i < b.end; i++) used.add(i);
    if (b.headerIndex >= 0) used.add(b.headerIndex);
    if (b.groupIndex >= 0) used.add(b.groupIndex);
  }
  const lastEnd = blocks[blocks.length - 1]!.end;
  let footerLines = 0;
  for (let i = 0; i < rows.length; i++) {
    if (used.has(i) || isBlank(rows[i]!)) continue;
    if (i >= lastEnd) footerLines++;
    addMetadata(metadata, rows[i]!);
  }
  if (footerLines > 0) warnings.push(`${footerLines} non-data line(s) after the data (from line ${lastEnd + 1}) were read as metadata`);

  const traces = tracesOf(blocks);
  const trace = chooseTrace(fileName, blocks, traces, options);
  const b = blocks[trace.block - 1]!;
  const xName = b.names[trace.xColumn]!;
  const columnName = trace.label;

  if (blocks.length > 1 && detectYUnit(xName) && !detectXUnit(xName)) {
    throw new SpectrumFileError(
      fileName,
      `block ${trace.block} has no X column: its first column "${xName}" holds Y values; put the X values (nm, µm, cm-1 or eV) first in each block`,
      { line: (b.headerIndex >= 0 ? b.headerIndex : b.start) + 1 },
    );
  }

  const x: number[] = [];
  const y: number[] = [];
  const lineNos: number[] = [];
  let missing = 0;
  for (let i = b.start; i < b.end; i++) {
    const r = rows[i]!;
    const xCell = r[trace.xColumn] ?? '';
    const cell = r[trace.column] ?? '';
    const xv = parseNumberCell(xCell, dc);
    const yv = parseNumberCell(cell, dc);
    if (b.pairs && xv === undefined && yv === undefined) {
      missing++;
      continue;
    }
    if (xv === undefined || Number.isNaN(xv)) {
      const problem = isNonFiniteWord(xCell) ? `X value "${xCell}" is not finite` : `X value "${xCell.slice(0, 40)}" is not a number`;
      throw new SpectrumFileError(fileName, problem, { line: i + 1, column: xName });
    }
    if (yv === undefined) {
      missing++;
      continue;
    }
    if (Number.isNaN(yv)) {
      const problem = isNonFiniteWord(cell) ? `value "${cell}" is not finite` : `value "${cell.slice(0, 40)}" is not a number`;
      throw new SpectrumFileError(fileName, problem, { line: i + 1, column: columnName });
    }
    if (!Number.isFinite(xv)) throw new SpectrumFileError(fileName, 'X value is not finite', { line: i + 1, column: xName });
    x.push(xv);
    y.push(yv);
    lineNos.push(i + 1);
  }
  if (missing > 0) {
    if (x.length === 0) throw new SpectrumFileError(fileName, 'column has no values', { column: columnName });
    warnings.push(`column "${columnName}": ${missing} empty cell(s) skipped; ${x.length} points kept`);
  }

  // X unit: the person's choice, else the header, the group line, the metadata, else the values
  const metaText = Object.entries(metadata)
    .map(([k, v]) => `${k} ${v}`)
    .join('\n');
  const stated = statedXUnits(xName);
  if (!options.xUnit && stated.size > 1) {
    throw new SpectrumFileError(fileName, `mixed units in one column: the header names ${[...stated].join(' and ')}; choose the X unit`, {
      column: xName,
    });
  }
  let xUnit: XUnit | undefined = options.xUnit;
  let xUnitSource: UnitSource = 'chosen';
  if (!xUnit) {
    xUnit = detectXUnit(xName) ?? (trace.group ? detectXUnit(trace.group) : undefined) ?? detectXUnit(metaText);
    xUnitSource = 'file';
  }
  if (!xUnit) {
    const guess = inferXUnit(x);
    if (guess.unit) {
      xUnit = guess.unit;
      xUnitSource = 'values';
      warnings.push(`X unit ${guess.unit} inferred from the values (${guess.rule}); choose the X unit if that is wrong`);
    } else {
      throw new SpectrumFileError(
        fileName,
        `X unit unknown: the header does not say nm, µm, cm-1 or eV and the ${guess.rule}; choose the X unit (nm, um, cm-1 or eV)`,
        { column: xName },
      );
    }
  }
  const nameHint = detectTechniqueFromName(fileName);
  const headerText = b.headerIndex >= 0 ? rows[b.headerIndex]!.join(' ') : '';
  const fromFile =
    detectYUnit(trace.name) ??
    (trace.group ? detectYUnit(trace.group) : undefined) ??
    (headerText ? detectYUnit(headerText) : undefined) ??
    detectYUnit(metaText);
  const yUnit =
    options.yUnit ??
    fromFile ??
    (options.technique ? yUnitForTechnique(options.technique) : undefined) ??
    (nameHint ? yUnitForTechnique(nameHint) : undefined);
  if (!yUnit) {
    throw new SpectrumFileError(
      fileName,
      'Y unit unknown: neither the header nor the file says absorbance, %T or counts; choose the Y kind or technique',
      { column: columnName },
    );
  }
  if (!options.yUnit && !fromFile) {
    warnings.push(`Y unit "${yUnit}" inferred from the ${options.technique ? 'chosen technique' : 'file name'}`);
  }
  const layout: TableLayout = blocks.length > 1 ? 'blocks' : b.pairs ? 'pairs' : 'x-then-y';
  const out: TableResult = {
    x,
    y,
    lines: lineNos,
    xUnit,
    xUnitSource,
    yUnit,
    columnName,
    columnIndex: trace.column,
    availableColumns: traces.filter((t) => t.block === trace.block).map((t) => t.label),
    metadata,
    layout,
    traces,
    block: trace.block,
    warnings,
  };
  if (trace.pair !== undefined) out.pair = trace.pair;
  if (nameHint) out.techniqueHint = nameHint;
  return out;
}
