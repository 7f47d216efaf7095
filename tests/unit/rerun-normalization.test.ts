import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { mergeParameters, parameterHash, reanalysisSchema, type AnalysisParameters } from "@/lib/ingest/parameters";
import { NORMALIZATION_WAVELENGTH_NM, normalizationSchema } from "@/lib/ingest/normalization";
import { fieldErrorsOf, formFieldOf, rerunFormSchema, toReanalysisChanges } from "@/lib/spectrum-view/rerunSchema";

// Normalisation as a re-run parameter: the API schema's field-named refusals, how it merges into
// the stored parameters and the parameter hash, and the re-run form that feeds it.
// Sources: the bounds are this project's own (lib/ingest/normalization.ts: 100 nm to 400 cm⁻¹ =
// 25 000 nm, concentrations within a factor of 1000); every other value is made up by the test.

const spectrumId = "3f0c2a4e-5b6d-4c7e-8f90-a1b2c3d4e5f6";
const referenceId = "9a1b2c3d-4e5f-4a6b-8c7d-0e1f2a3b4c5d";
const base: AnalysisParameters = { technique: "absorption", material: "CdSe", smoothingWindow: 15 };

/** The first refusal as requestReanalysis words it: "field.path: message". */
function refusal(changes: unknown): string | null {
  const r = reanalysisSchema.safeParse(changes);
  if (r.success) return null;
  const issue = r.error.issues[0]!;
  return `${issue.path.map(String).join(".")}: ${issue.message}`;
}

describe("normalisation in the re-analysis schema", () => {
  it("accepts each mode with the members it needs", () => {
    expect(reanalysisSchema.parse({ normalization: { mode: "wavelength", wavelengthNm: 450 } }).normalization).toEqual({
      mode: "wavelength",
      wavelengthNm: 450,
    });
    expect(
      reanalysisSchema.parse({ normalization: { mode: "concentration", sampleConcentration: 0.6, referenceConcentration: 1 } })
        .normalization,
    ).toEqual({ mode: "concentration", sampleConcentration: 0.6, referenceConcentration: 1 });
    expect(reanalysisSchema.parse({ normalization: { mode: "none" } }).normalization).toEqual({ mode: "none" });
    expect(reanalysisSchema.parse({ normalization: null }).normalization).toBeNull();
  });

  it("names the field of every refusal", () => {
    const { min, max } = NORMALIZATION_WAVELENGTH_NM;
    expect(refusal({ normalization: { mode: "wavelength", wavelengthNm: min - 1 } })).toBe(
      `normalization.wavelengthNm: must lie between ${min} and ${max} nm`,
    );
    expect(refusal({ normalization: { mode: "wavelength", wavelengthNm: max + 1 } })).toBe(
      `normalization.wavelengthNm: must lie between ${min} and ${max} nm`,
    );
    expect(refusal({ normalization: { mode: "wavelength" } })).toBe("normalization.wavelengthNm: is required for mode wavelength");
    expect(refusal({ normalization: { mode: "wavelength", wavelengthNm: "450" } })).toBe("normalization.wavelengthNm: must be a number");
    expect(refusal({ normalization: { mode: "concentration", sampleConcentration: 0, referenceConcentration: 1 } })).toBe(
      "normalization.sampleConcentration: must be positive",
    );
    expect(refusal({ normalization: { mode: "concentration", sampleConcentration: 1, referenceConcentration: -2 } })).toBe(
      "normalization.referenceConcentration: must be positive",
    );
    expect(refusal({ normalization: { mode: "concentration", sampleConcentration: 1 } })).toBe(
      "normalization.referenceConcentration: is required for mode concentration",
    );
    expect(refusal({ normalization: { mode: "concentration", sampleConcentration: 1, referenceConcentration: 1001 } })).toBe(
      "normalization.referenceConcentration: the two concentrations must lie within a factor of 1000 of each other",
    );
    expect(refusal({ normalization: { mode: "area" } })).toBe("normalization.mode: must be one of auto, none, wavelength, concentration");
    expect(refusal({ normalization: "concentration" })).toBe("normalization: must be an object with a mode, or null");
    expect(refusal({ normalization: { mode: "none", wavelengthNm: 450 } })).toMatch(/^normalization: Unrecognized key/);
  });

  it("accepts exactly the wavelengths within the stated bounds", () => {
    const { min, max } = NORMALIZATION_WAVELENGTH_NM;
    fc.assert(
      fc.property(fc.oneof(fc.double({ min: 0, max: 40_000, noNaN: true }), fc.constantFrom(min - 1e-9, min, max, max + 1e-9)), (nm) => {
        expect(normalizationSchema.safeParse({ mode: "wavelength", wavelengthNm: nm }).success).toBe(nm >= min && nm <= max);
      }),
    );
  });
});

describe("normalisation in the stored parameters and their hash", () => {
  const byConcentration = { mode: "concentration" as const, sampleConcentration: 0.6, referenceConcentration: 1 };

  it("replaces the whole normalisation, keeps it when absent, clears it with null or mode auto, keeps an explicit none", () => {
    const withConcentration = mergeParameters(base, reanalysisSchema.parse({ normalization: byConcentration }));
    expect(withConcentration).toEqual({ ...base, normalization: byConcentration });
    const atWavelength = mergeParameters(
      withConcentration,
      reanalysisSchema.parse({ normalization: { mode: "wavelength", wavelengthNm: 450 } }),
    );
    expect(atWavelength.normalization).toEqual({ mode: "wavelength", wavelengthNm: 450 });
    expect(mergeParameters(atWavelength, reanalysisSchema.parse({ smoothingWindow: 21 })).normalization).toEqual({
      mode: "wavelength",
      wavelengthNm: 450,
    });
    expect(mergeParameters(atWavelength, reanalysisSchema.parse({ normalization: null }))).toEqual(base);
    expect(mergeParameters(atWavelength, reanalysisSchema.parse({ normalization: { mode: "auto" } }))).toEqual(base);
    // engine 2 defaults to auto: "none" must stay stored so the run is re-run unscaled
    expect(mergeParameters(atWavelength, reanalysisSchema.parse({ normalization: { mode: "none" } }))).toEqual({
      ...base,
      normalization: { mode: "none" },
    });
  });

  it("a different normalisation is a new run; the same one, however written, is the same run", () => {
    const plain = parameterHash(base, referenceId);
    const concentration = parameterHash(mergeParameters(base, reanalysisSchema.parse({ normalization: byConcentration })), referenceId);
    const reordered = parameterHash(
      mergeParameters(
        base,
        reanalysisSchema.parse({ normalization: { referenceConcentration: 1, mode: "concentration", sampleConcentration: 0.6 } }),
      ),
      referenceId,
    );
    const otherRatio = parameterHash(
      mergeParameters(base, reanalysisSchema.parse({ normalization: { ...byConcentration, sampleConcentration: 0.5 } })),
      referenceId,
    );
    const wavelength = parameterHash(
      mergeParameters(base, reanalysisSchema.parse({ normalization: { mode: "wavelength", wavelengthNm: 450 } })),
      referenceId,
    );
    const none = parameterHash(mergeParameters(base, reanalysisSchema.parse({ normalization: { mode: "none" } })), referenceId);
    const auto = parameterHash(mergeParameters(base, reanalysisSchema.parse({ normalization: { mode: "auto" } })), referenceId);
    expect(reordered).toBe(concentration);
    expect(new Set([plain, concentration, otherRatio, wavelength, none]).size).toBe(5);
    expect(auto).toBe(plain);
  });
});

describe("the re-run form's normalisation fields", () => {
  const form = (fields: Record<string, string>) => rerunFormSchema.safeParse({ spectrumId, ...fields });

  it("turns a chosen mode and its fields into the API's change", () => {
    const concentration = form({ normalizationMode: "concentration", sampleConcentration: "0,6", referenceConcentration: " 1 " });
    expect(concentration.success && toReanalysisChanges(concentration.data)).toEqual({
      normalization: { mode: "concentration", sampleConcentration: 0.6, referenceConcentration: 1 },
    });
    const wavelength = form({ normalizationMode: "wavelength", normalizationWavelengthNm: "450" });
    expect(wavelength.success && toReanalysisChanges(wavelength.data)).toEqual({
      normalization: { mode: "wavelength", wavelengthNm: 450 },
    });
    const none = form({ normalizationMode: "none" });
    expect(none.success && toReanalysisChanges(none.data)).toEqual({ normalization: { mode: "none" } });
    const auto = form({ normalizationMode: "auto" });
    expect(auto.success && toReanalysisChanges(auto.data)).toEqual({ normalization: { mode: "auto" } });
    const kept = form({ normalizationMode: "", smoothingWindow: "21" });
    expect(kept.success && toReanalysisChanges(kept.data)).toEqual({ smoothingWindow: 21 });
  });

  it("puts each refusal beside its field", () => {
    const errorsOf = (fields: Record<string, string>) => {
      const r = form(fields);
      return r.success ? {} : fieldErrorsOf(r.error);
    };
    expect(errorsOf({ normalizationMode: "wavelength" })).toEqual({
      normalizationWavelengthNm: ["Enter the wavelength to scale the sample to its reference at"],
    });
    expect(errorsOf({ normalizationMode: "wavelength", normalizationWavelengthNm: "40" })).toEqual({
      normalizationWavelengthNm: ["Wavelength must lie between 100 and 25000 nm"],
    });
    expect(errorsOf({ normalizationMode: "wavelength", normalizationWavelengthNm: "blue" })).toEqual({
      normalizationWavelengthNm: ["Wavelength must be a number"],
    });
    expect(errorsOf({ normalizationMode: "concentration", sampleConcentration: "-1" })).toEqual({
      sampleConcentration: ["Sample concentration must be positive"],
      referenceConcentration: ["Enter the reference concentration"],
    });
    expect(errorsOf({ normalizationMode: "concentration", sampleConcentration: "1", referenceConcentration: "2000" })).toEqual({
      referenceConcentration: ["The two concentrations must lie within a factor of 1000 of each other"],
    });
    expect(errorsOf({ normalizationMode: "area" })).toEqual({
      normalizationMode: ["Normalisation must be automatic, none, at a wavelength or by concentration"],
    });
  });

  it("accepts a normalisation exactly when the API schema does", () => {
    const { min, max } = NORMALIZATION_WAVELENGTH_NM;
    // values at and around the bounds (wavelength and the factor-1000 ratio) as often as random ones
    const edges = fc.constantFrom(0, -1, min - 0.5, min, max, max + 0.5, 0.001, 0.0009, 1, 1000, 1000.5);
    const value = fc.oneof(fc.double({ min: -10, max: 30_000, noNaN: true, noDefaultInfinity: true }), edges, fc.constant(undefined));
    fc.assert(
      fc.property(fc.constantFrom("none", "wavelength", "concentration"), value, value, value, (mode, nm, sample, reference) => {
        const fields: Record<string, string> = { normalizationMode: mode };
        if (nm !== undefined) fields.normalizationWavelengthNm = String(nm);
        if (sample !== undefined) fields.sampleConcentration = String(sample);
        if (reference !== undefined) fields.referenceConcentration = String(reference);
        const parsedForm = form(fields);
        const api = parsedForm.success ? reanalysisSchema.safeParse(toReanalysisChanges(parsedForm.data)).success : false;
        const direct = normalizationSchema.safeParse(
          mode === "none"
            ? { mode }
            : mode === "wavelength"
              ? { mode, wavelengthNm: nm }
              : { mode, sampleConcentration: sample, referenceConcentration: reference },
        ).success;
        expect(parsedForm.success).toBe(direct);
        expect(api).toBe(direct);
      }),
    );
  });

  it("shows the API's refusals beside the form's fields, without the API field name", () => {
    expect(formFieldOf("normalization.wavelengthNm", "normalization.wavelengthNm: must lie between 100 and 25000 nm")).toEqual({
      field: "normalizationWavelengthNm",
      message: "Wavelength must lie between 100 and 25000 nm",
    });
    expect(formFieldOf("normalization", "normalization: needs a parent reference spectrum, and the run would have none")).toEqual({
      field: "normalizationMode",
      message: "Normalisation needs a parent reference spectrum, and the run would have none",
    });
    expect(formFieldOf("thresholds.minShiftMeV", "thresholds.minShiftMeV: minShiftMeV must be positive")).toEqual({
      field: "minShiftMeV",
      message: "thresholds.minShiftMeV: minShiftMeV must be positive",
    });
    expect(formFieldOf(undefined, "x")).toEqual({ field: undefined, message: "x" });
  });
});
