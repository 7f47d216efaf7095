import { z } from "zod";

// The shapes of supernatant links and readings, shared by the route handler, the server actions
// and the series page's panel (no server imports here).

// Messages leave out the field's name: the API's error names the field in front of them.
const wavelength = () =>
  z.coerce
    .number({ error: "give a wavelength in nm" })
    .refine(Number.isFinite, "give a wavelength in nm")
    .pipe(z.number().min(200, "must be at least 200 nm").max(3000, "must be at most 3000 nm"));
const spectrumId = () => z.string().uuid("must be a spectrum id (UUID)");

/** Query of GET /api/v1/series/{id}/supernatants: the two reading wavelengths and, optionally, spectra of each pure dot. */
export const readingsQuerySchema = z.object({
  nmA: wavelength(),
  nmX: wavelength(),
  pureA: spectrumId().optional(),
  pureX: spectrumId().optional(),
});
export type ReadingsQuery = z.infer<typeof readingsQuerySchema>;

/** Body of POST /api/v1/series/{id}/supernatants: link a supernatant to a point, or unlink it with pointSpectrumId null. */
export const linkBodySchema = z.object({
  supernatantSpectrumId: spectrumId(),
  pointSpectrumId: spectrumId().nullable(),
});
export type LinkBody = z.infer<typeof linkBodySchema>;

/** One spectrum read at the two wavelengths. */
export type AbsorbanceReading = {
  spectrumId: string;
  fileName: string;
  /** Absorbance at dot A's wavelength, or null when it could not be read (see error). */
  atA: number | null;
  atX: number | null;
  /** Path length stated at upload, else in the file, cm; null when neither states one. */
  pathLengthCm: number | null;
  /** Why the values could not be read, naming the file; null when both were read. */
  error: string | null;
};

export type SupernatantReadings = {
  seriesId: string;
  wavelengthsNm: { a: number; x: number };
  /** How the values were read (measured, interpolated), for the page to say. */
  reading: string;
  /** Every point of the series in order of the variable, with its supernatant when one is linked. */
  points: { spectrumId: string; fileName: string; seriesValue: number | null; supernatant: AbsorbanceReading | null }[];
  pureA: AbsorbanceReading | null;
  pureX: AbsorbanceReading | null;
};
