import ExcelJS from 'exceljs';
import { unzipSync } from 'fflate';
import { SpectrumFileError } from '../errors';

export interface WorkbookTable {
  rows: string[][];
  sheet: string;
  sheets: string[];
}

/** Largest uncompressed size of a workbook's parts, as a multiple of the file size limit (against zip bombs). */
const MAX_EXPANSION = 10;

function cellText(value: ExcelJS.CellValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'string') return value.trim();
  if (typeof value === 'boolean') return String(value);
  if (value instanceof Date) return value.toISOString();
  if (typeof value === 'object') {
    if ('result' in value) return cellText((value as ExcelJS.CellFormulaValue).result as ExcelJS.CellValue);
    if ('richText' in value)
      return value.richText
        .map((r) => r.text)
        .join('')
        .trim();
    if ('text' in value) return String(value.text).trim();
    if ('error' in value) return String(value.error);
  }
  return '';
}

function sheetRows(ws: ExcelJS.Worksheet): string[][] {
  const rows: string[][] = [];
  const width = ws.actualColumnCount > 0 ? ws.columnCount : 0;
  for (let r = 1; r <= ws.rowCount; r++) {
    const row = ws.getRow(r);
    const cells: string[] = [];
    for (let c = 1; c <= width; c++) cells.push(cellText(row.getCell(c).value));
    while (cells.length > 0 && cells[cells.length - 1] === '') cells.pop();
    rows.push(cells);
  }
  return rows;
}

const hasNumericTable = (rows: string[][]) => {
  let run = 0;
  for (const r of rows) {
    run =
      r.length >= 2 && r[0] !== '' && Number.isFinite(Number(r[0])) && r.slice(1).some((c) => c !== '' && Number.isFinite(Number(c)))
        ? run + 1
        : 0;
    if (run >= 3) return true;
  }
  return false;
};

/**
 * Reads one sheet of an .xlsx workbook (in memory, with exceljs) as rows of text cells, for the
 * same table reader as delimited text. `sheet` is a name or a 1-based number; without it, the
 * first sheet holding a numeric table. The workbook is never treated as a zip of files.
 */
export async function readWorkbookRows(
  fileName: string,
  bytes: Uint8Array,
  sheet: string | number | undefined,
  maxBytes: number,
): Promise<WorkbookTable> {
  let expanded = 0;
  try {
    unzipSync(bytes, {
      filter(f) {
        expanded += f.originalSize;
        return false;
      },
    });
  } catch {
    throw new SpectrumFileError(fileName, 'is not a readable spreadsheet (.xlsx): the workbook is damaged; export the sheet as CSV');
  }
  if (expanded > MAX_EXPANSION * maxBytes) {
    throw new SpectrumFileError(
      fileName,
      `spreadsheet expands to ${expanded} bytes, over ${MAX_EXPANSION} × the file limit; export the sheet as CSV`,
    );
  }
  const workbook = new ExcelJS.Workbook();
  try {
    await workbook.xlsx.load(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.length) as unknown as ExcelJS.Buffer);
  } catch (e) {
    const why = e instanceof Error ? e.message.split('\n')[0]!.slice(0, 120) : 'unknown';
    throw new SpectrumFileError(fileName, `is not a readable spreadsheet (.xlsx): ${why}; export the sheet as CSV`);
  }
  const sheets = workbook.worksheets.map((w) => w.name);
  if (sheets.length === 0) throw new SpectrumFileError(fileName, 'the spreadsheet has no sheets; export the data as CSV');
  let ws: ExcelJS.Worksheet | undefined;
  if (sheet !== undefined) {
    const n = typeof sheet === 'number' ? sheet : /^\d+$/.test(sheet.trim()) ? Number(sheet) : undefined;
    ws =
      n !== undefined
        ? workbook.worksheets[n - 1]
        : workbook.worksheets.find((w) => w.name === sheet || w.name.toLowerCase() === String(sheet).trim().toLowerCase());
    if (!ws)
      throw new SpectrumFileError(
        fileName,
        `no sheet ${typeof sheet === 'number' ? sheet : `'${sheet}'`} (sheets: ${sheets.map((s) => `'${s}'`).join(', ')})`,
      );
    const rows = sheetRows(ws);
    if (!hasNumericTable(rows)) {
      throw new SpectrumFileError(
        fileName,
        `no numeric table found on sheet '${ws.name}'; export the sheet as CSV or choose another sheet`,
      );
    }
    return { rows, sheet: ws.name, sheets };
  }
  for (const w of workbook.worksheets) {
    const rows = sheetRows(w);
    if (hasNumericTable(rows)) return { rows, sheet: w.name, sheets };
  }
  throw new SpectrumFileError(
    fileName,
    `no numeric table found on sheet${sheets.length > 1 ? 's' : ''} ${sheets.map((s) => `'${s}'`).join(', ')}; export the sheet as CSV or choose another sheet`,
  );
}
