const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04];

/**
 * True for an Office Open XML workbook: named .xlsx/.xlsm, or a zip whose entry names (stored
 * uncompressed in the local headers and the central directory at the end) include the workbook
 * part "xl/workbook.xml", as Excel and LibreOffice write it.
 */
export function looksLikeSpreadsheet(fileName: string, bytes: Uint8Array): boolean {
  if (/\.xls[xm]$/i.test(fileName)) return true;
  if (!ZIP_MAGIC.every((b, i) => bytes[i] === b)) return false;
  const latin = (from: number, to: number) =>
    new TextDecoder('latin1').decode(bytes.subarray(Math.max(0, from), Math.min(bytes.length, to)));
  return latin(0, 65536).includes('xl/workbook.xml') || latin(bytes.length - 65536, bytes.length).includes('xl/workbook.xml');
}
