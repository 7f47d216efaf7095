"use client";

import { useState, type ReactNode } from "react";
import { inputClass } from "@/components/forms/Field";

type FieldRenderer = (name: string, label: string, placeholder: string, hint?: string) => ReactNode;

/**
 * The re-run form's normalisation control: a mode, then only the fields that mode needs.
 * Disabled, with a hint, when the run would have no parent reference to scale against.
 */
export function NormalizationFields({
  current,
  hasReference,
  initialMode,
  errors,
  field,
}: {
  /** How the shown run was normalised, in words ("none", "by concentration …"); null before any run finished. */
  current: string | null;
  hasReference: boolean;
  initialMode: string;
  errors: Record<string, string[]>;
  field: FieldRenderer;
}) {
  const [mode, setMode] = useState(initialMode);
  const error = errors.normalizationMode;
  return (
    <fieldset className="space-y-2" data-testid="rerun-normalization">
      <legend className="mb-1 text-xs font-semibold text-ink-soft">Normalisation against the reference</legend>
      <div>
        <label htmlFor="rerun-normalizationMode" className="text-xs font-medium">
          Scale the sample
        </label>
        <select
          id="rerun-normalizationMode"
          name="normalizationMode"
          defaultValue={initialMode}
          disabled={!hasReference}
          onChange={(e) => setMode(e.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? "rerun-normalizationMode-error" : hasReference ? undefined : "rerun-normalization-no-reference"}
          className={`${inputClass} mt-0.5 py-1 disabled:bg-stone-100 disabled:text-ink-faint`}
        >
          <option value="">keep ({current ?? "automatic"})</option>
          <option value="auto">automatic (fitted on the continuum)</option>
          <option value="none">none</option>
          <option value="concentration">by concentration</option>
          <option value="wavelength">at a wavelength</option>
        </select>
        {!hasReference && (
          <p id="rerun-normalization-no-reference" className="text-[11px] text-ink-faint">
            Normalisation scales the sample to its parent reference spectrum; this spectrum has none.
          </p>
        )}
        {error && (
          <p id="rerun-normalizationMode-error" role="alert" className="mt-0.5 text-xs text-red-700">
            {error.join(" ")}
          </p>
        )}
      </div>
      {hasReference && mode === "concentration" && (
        <>
          <div className="grid grid-cols-2 gap-3">
            {field("sampleConcentration", "Sample concentration", "e.g. 0.6")}
            {field("referenceConcentration", "Reference concentration", "e.g. 1")}
          </div>
          <p className="text-[11px] text-ink-faint">
            Same unit for both; the sample is multiplied by reference ÷ sample (absorbance is proportional to concentration).
          </p>
        </>
      )}
      {hasReference &&
        mode === "wavelength" &&
        field(
          "normalizationWavelengthNm",
          "Wavelength (nm)",
          "e.g. 450",
          "The sample is scaled to equal the reference here; pick a wavelength the change does not touch.",
        )}
    </fieldset>
  );
}
