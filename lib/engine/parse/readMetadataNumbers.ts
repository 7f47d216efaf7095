/**
 * Finds the optical path length (cm) and excitation wavelength (nm) in header key/values, and
 * an excitation wavelength written in the file name as "ex365" / "exc_365nm".
 */
export function readMetadataNumbers(
  metadata: Record<string, string>,
  fileName: string,
): { pathLengthCm?: number; excitationNm?: number; excitationFromName: boolean } {
  let pathLengthCm: number | undefined;
  let excitationNm: number | undefined;
  for (const [key, value] of Object.entries(metadata)) {
    const k = key.toLowerCase();
    const m = /([0-9]+(?:[.,][0-9]+)?)\s*(mm|cm|nm)?/i.exec(value);
    if (!m) continue;
    const v = Number(m[1]!.replace(',', '.'));
    if (!Number.isFinite(v) || v <= 0) continue;
    if (pathLengthCm === undefined && /path\s*length|pathlength|cell length|cuvette/.test(k)) {
      pathLengthCm = m[2]?.toLowerCase() === 'mm' ? v / 10 : v;
    } else if (excitationNm === undefined && /excitation|ex\.?\s*wavelength|λ\s*ex|lambda\s*ex/.test(k)) {
      if (v > 150 && v < 3000) excitationNm = v;
    }
  }
  let excitationFromName = false;
  if (excitationNm === undefined) {
    const m = /(?:^|[^a-z])exc?[-_]?(\d{3,4})(?:nm)?(?:[^0-9]|$)/i.exec(fileName);
    if (m) {
      const v = Number(m[1]);
      if (v > 150 && v < 3000) {
        excitationNm = v;
        excitationFromName = true;
      }
    }
  }
  const out: { pathLengthCm?: number; excitationNm?: number; excitationFromName: boolean } = { excitationFromName };
  if (pathLengthCm !== undefined) out.pathLengthCm = pathLengthCm;
  if (excitationNm !== undefined) out.excitationNm = excitationNm;
  return out;
}
