import type { ParseOptions, ParsedSpectrum } from '../types';
import { checkedLimits, parseSpectrumFile, spectrumFromTable } from './parseSpectrumFile';
import { looksLikeSpreadsheet } from './looksLikeSpreadsheet';
import { parseTableRows } from './parseTableRows';
import { readWorkbookRows } from './readWorkbookRows';
import { SpectrumFileError } from '../errors';

/**
 * Any supported file, spreadsheets included: an .xlsx sheet is read as a table of cells
 * (exceljs, in memory, no I/O) and goes through the same table reader as delimited text;
 * everything else is parseSpectrumFile.
 */
export async function parseSpectrumBytes(fileName: string, bytes: Uint8Array, options: ParseOptions = {}): Promise<ParsedSpectrum> {
  const { maxBytes, minPoints } = checkedLimits(fileName, bytes, options);
  if (!looksLikeSpreadsheet(fileName, bytes)) return parseSpectrumFile(fileName, bytes, options);
  if (bytes.length > maxBytes) throw new SpectrumFileError(fileName, `file is ${bytes.length} bytes, over the ${maxBytes}-byte limit`);
  const book = await readWorkbookRows(fileName, bytes, options.sheet, maxBytes);
  const named = `${fileName} (sheet '${book.sheet}')`;
  const table = parseTableRows(named, book.rows, false, options);
  return spectrumFromTable(fileName, table, {
    format: 'spreadsheet',
    encoding: 'xlsx',
    minPoints,
    sheet: book.sheet,
    sheets: book.sheets,
    ...(options.technique ? { technique: options.technique } : {}),
  });
}
