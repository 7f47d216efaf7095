import { z } from "zod";
import type { Normalization } from "@/lib/engine/types";

// How a sample is scaled against its parent reference before the difference (the engine's
// `Normalization`), as a re-run parameter. No server imports: the re-run form uses the bounds too.

export const NORMALIZATION_MODES = ["auto", "none", "wavelength", "concentration"] as const;

/** Accepted normalisation wavelengths: deep UV to the end of the mid-IR (400 cm⁻¹ = 25 000 nm). */
export const NORMALIZATION_WAVELENGTH_NM = { min: 100, max: 25_000 } as const;

/**
 * Largest accepted ratio of the two concentrations (either way round): absorbance is
 * measured over about three decades, so two solutions further apart than that cannot both
 * be on scale (common practice).
 */
export const MAX_CONCENTRATION_RATIO = 1000;

const { min, max } = NORMALIZATION_WAVELENGTH_NM;
const requiredNumber = (what: string) =>
  z.number({ error: (issue) => (issue.input === undefined ? `is required ${what}` : "must be a number") });

const wavelengthNm = requiredNumber("for mode wavelength")
  .min(min, `must lie between ${min} and ${max} nm`)
  .max(max, `must lie between ${min} and ${max} nm`);
const concentration = requiredNumber("for mode concentration").positive("must be positive");

/** One normalisation as the API and the stored run parameters carry it. */
export const normalizationSchema = z.discriminatedUnion(
  "mode",
  [
    z.object({ mode: z.literal("auto") }).strict(),
    z.object({ mode: z.literal("none") }).strict(),
    z.object({ mode: z.literal("wavelength"), wavelengthNm }).strict(),
    z
      .object({ mode: z.literal("concentration"), sampleConcentration: concentration, referenceConcentration: concentration })
      .strict()
      .refine((n) => concentrationRatioInRange(n.sampleConcentration, n.referenceConcentration), {
        path: ["referenceConcentration"],
        message: `the two concentrations must lie within a factor of ${MAX_CONCENTRATION_RATIO} of each other`,
      }),
  ],
  {
    error: (issue) =>
      issue.input !== null && typeof issue.input === "object"
        ? `must be one of ${NORMALIZATION_MODES.join(", ")}`
        : "must be an object with a mode, or null",
  },
);

/** True when the ratio is within bounds; other checks refuse non-positive concentrations. */
export function concentrationRatioInRange(sample: number, reference: number): boolean {
  if (!(sample > 0 && reference > 0)) return true;
  const ratio = reference / sample;
  return ratio >= 1 / MAX_CONCENTRATION_RATIO && ratio <= MAX_CONCENTRATION_RATIO;
}

// The schema's output must be something the engine accepts.
type Assignable<T extends Normalization> = T;
export type NormalizationParameter = Assignable<z.output<typeof normalizationSchema>>;
