// Reads the supernatant spectra linked to the points of a series (and, when asked, a spectrum of
// each pure dot) at the two wavelengths of a depletion analysis. Values are the measured
// absorbances of the raw files as they arrived; the parsed files come from lib/rawSpectra's cache,
// so a person changing a wavelength does not fetch and parse the files again.
import type { Actor } from "@/lib/auth/actor";
import { canReadSeries } from "@/lib/auth/access";
import { selectRows } from "@/lib/db";
import { SpectrumFileError } from "@/lib/engine";
import type { ParsedSpectrum } from "@/lib/engine/types";

import type { ReadChoice } from "@/lib/engine";
import { getReadableSpectrum } from "@/lib/queries/spectrum-status";
import { parsedRawFile, storedReadChoice } from "@/lib/rawSpectra";
import { Series } from "@/models";
import { ABSORBANCE_READING, readAbsorbanceAt } from "@/lib/series/readAbsorbanceAt";
import type { AbsorbanceReading, ReadingsQuery, SupernatantReadings } from "@/lib/series/supernatantSchemas";
import { Refusal } from "@/lib/errors";

type StoredFile = {
  id: string;
  fileName: string;
  objectKey: string;
  sha256: string;
  columnChoice: string | null;
  readOptions: ReadChoice | null;
  pathLengthCm: number | null;
};
type Parsed = Pick<ParsedSpectrum, "x" | "y" | "xUnit" | "yUnit" | "pathLengthCm">;

async function parsedOf(file: StoredFile): Promise<Parsed> {
  return parsedRawFile({ fileName: file.fileName, technique: "absorption", objectKey: file.objectKey }, storedReadChoice(file));
}

/** One file read at both wavelengths; a file that cannot be read, or lacks a wavelength, says so in `error`. */
async function readFile(file: StoredFile, nmA: number, nmX: number): Promise<AbsorbanceReading> {
  const out: AbsorbanceReading = {
    spectrumId: file.id,
    fileName: file.fileName,
    atA: null,
    atX: null,
    pathLengthCm: file.pathLengthCm,
    error: null,
  };
  let parsed: Parsed;
  try {
    parsed = await parsedOf(file);
  } catch (error) {
    if (error instanceof SpectrumFileError) return { ...out, error: `${file.fileName}: the file could not be read (${error.message})` };
    throw error;
  }
  out.pathLengthCm = file.pathLengthCm ?? parsed.pathLengthCm ?? null;
  const problems: string[] = [];
  for (const [key, nm] of [
    ["atA", nmA],
    ["atX", nmX],
  ] as const) {
    try {
      out[key] = readAbsorbanceAt(parsed, nm);
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
      problems.push(error.message);
    }
  }
  if (problems.length) out.error = `${file.fileName}: ${[...new Set(problems)].join("; ")}`;
  return out;
}

async function pureSpectrum(actor: Actor, id: string | undefined, field: "pureA" | "pureX"): Promise<StoredFile | null> {
  if (!id) return null;
  const spectrum = await getReadableSpectrum(actor, id);
  if (!spectrum) throw new Refusal(404, "not-found", `${field}: spectrum ${id} was not found`, field);
  if (spectrum.technique !== "absorption")
    throw new Refusal(400, "invalid", `${field}: ${spectrum.fileName} is not an absorption spectrum`, field);
  return {
    id: spectrum.id,
    fileName: spectrum.fileName,
    objectKey: spectrum.objectKey,
    sha256: spectrum.sha256,
    columnChoice: spectrum.columnChoice,
    readOptions: spectrum.readOptions,
    pathLengthCm: spectrum.pathLengthCm,
  };
}

/**
 * Every point of a series with its linked supernatant read at nmA and nmX, plus the pure-dot
 * spectra asked for; null when the series is not found or not readable by the actor (a pure
 * spectrum the actor may not read is a 404 naming its field).
 */
export async function getSupernatantReadings(actor: Actor, seriesId: string, query: ReadingsQuery): Promise<SupernatantReadings | null> {
  const series = await Series.findByPk(seriesId);
  if (!series || !(await canReadSeries(actor, series))) return null;
  const [pureA, pureX] = await Promise.all([pureSpectrum(actor, query.pureA, "pureA"), pureSpectrum(actor, query.pureX, "pureX")]);
  const rows = await selectRows<{
    id: string;
    file_name: string;
    series_value: number | null;
    sup_id: string | null;
    sup_file_name: string | null;
    sup_object_key: string | null;
    sup_sha256: string | null;
    sup_column_choice: string | null;
    sup_read_options: ReadChoice | null;
    sup_path_length_cm: number | null;
  }>(
    `SELECT p.id, p.file_name, p.series_value,
       s.id AS sup_id, s.file_name AS sup_file_name, s.object_key AS sup_object_key, s.sha256 AS sup_sha256,
       s.column_choice AS sup_column_choice, s.read_options AS sup_read_options, s.path_length_cm AS sup_path_length_cm
     FROM spectra p LEFT JOIN spectra s ON s.supernatant_of_spectrum_id = p.id
     WHERE p.series_id = :id
     ORDER BY p.series_value NULLS LAST, p.created_at`,
    { id: series.id },
  );
  const read = (file: StoredFile | null) => (file ? readFile(file, query.nmA, query.nmX) : Promise.resolve(null));
  const [points, a, x] = await Promise.all([
    Promise.all(
      rows.map(async (r) => ({
        spectrumId: r.id,
        fileName: r.file_name,
        seriesValue: r.series_value,
        supernatant: await read(
          r.sup_id
            ? {
                id: r.sup_id,
                fileName: r.sup_file_name!,
                objectKey: r.sup_object_key!,
                sha256: r.sup_sha256!,
                columnChoice: r.sup_column_choice,
                readOptions: r.sup_read_options,
                pathLengthCm: r.sup_path_length_cm,
              }
            : null,
        ),
      })),
    ),
    read(pureA),
    read(pureX),
  ]);
  return { seriesId: series.id, wavelengthsNm: { a: query.nmA, x: query.nmX }, reading: ABSORBANCE_READING, points, pureA: a, pureX: x };
}
