"use client";

import { useActionState, useState } from "react";
import { inputClass } from "@/components/forms/Field";
import { initialActionState, type ActionState } from "@/lib/actions/protected-state";
import { THRESHOLD_FIELDS, fieldErrorsOf, rerunFormSchema } from "@/lib/spectrum-view/rerunSchema";
import { ParentPicker } from "@/components/parents/ParentPicker";
import type { ParentCandidate, ParentTarget } from "@/lib/parents/orderParentChoices";
import { NormalizationFields } from "./NormalizationFields";
import { RunProgress } from "./RunProgress";

type Current = {
  windowSize: number | null;
  polynomial: number | null;
  baseline: string | null;
  thresholds: Record<string, number>;
  /** The shown run's normalisation in words. */
  normalization: string | null;
};

/**
 * Re-run with changed parameters. The same zod schema checks the form here (errors beside the
 * fields before anything is sent) and in the server action.
 */
export function RerunForm({
  spectrumId,
  current,
  hasReference,
  action,
  parents,
}: {
  spectrumId: string;
  current: Current;
  /** Whether a re-run would compare against a parent reference (normalisation needs one). */
  hasReference: boolean;
  action: (state: ActionState, form: FormData) => Promise<ActionState>;
  /** The parent picker's choices and the reference the next run starts from. */
  parents?: { candidates: ParentCandidate[]; target: ParentTarget; currentId: string | null };
}) {
  const [parentId, setParentId] = useState(parents?.currentId ?? "");
  const parentChanged = parents !== undefined && parentId !== (parents.currentId ?? "");
  const [state, formAction, pending] = useActionState(action, initialActionState);
  const [clientErrors, setClientErrors] = useState<Record<string, string[]>>({});
  const errors = { ...(state.fieldErrors ?? {}), ...clientErrors };
  const value = (name: string) => (state.ok ? "" : (state.values?.[name] ?? ""));
  // Each answer of the action resets the form; the normalisation fields start again from it.
  const [answered, setAnswered] = useState({ state, count: 0 });
  if (answered.state !== state) setAnswered({ state, count: answered.count + 1 });

  const field = (name: string, label: string, placeholder: string, hint?: string) => (
    <div key={name}>
      <label htmlFor={`rerun-${name}`} className="text-xs font-medium">
        {label}
      </label>
      <input
        id={`rerun-${name}`}
        name={name}
        inputMode="decimal"
        defaultValue={value(name)}
        placeholder={placeholder}
        aria-invalid={errors[name] ? true : undefined}
        aria-describedby={errors[name] ? `rerun-${name}-error` : undefined}
        className={`${inputClass} mt-0.5 py-1`}
      />
      {hint && !errors[name] && <p className="text-[11px] text-ink-faint">{hint}</p>}
      {errors[name] && (
        <p id={`rerun-${name}-error`} role="alert" className="mt-0.5 text-xs text-red-700">
          {errors[name].join(" ")}
        </p>
      )}
    </div>
  );

  return (
    <div className="space-y-3">
      <form
        action={formAction}
        noValidate
        className="space-y-3"
        onSubmit={(e) => {
          const parsed = rerunFormSchema.safeParse(Object.fromEntries(new FormData(e.currentTarget).entries()));
          if (!parsed.success) {
            e.preventDefault();
            setClientErrors(fieldErrorsOf(parsed.error));
          } else setClientErrors({});
        }}
      >
        <input type="hidden" name="spectrumId" value={spectrumId} />
        <p className="text-xs text-ink-soft">Leave a field empty to keep the value of the last run (shown greyed).</p>
        <div className="grid grid-cols-2 gap-3">
          {field("smoothingWindow", "Smoothing window (points, odd)", current.windowSize ? String(current.windowSize) : "auto")}
          {field("smoothingPolynomial", "Polynomial order", current.polynomial ? String(current.polynomial) : "2")}
        </div>
        <div>
          <label htmlFor="rerun-baseline" className="text-xs font-medium">
            Baseline
          </label>
          <select
            id="rerun-baseline"
            name="baseline"
            defaultValue={value("baseline")}
            className={`${inputClass} mt-0.5 py-1`}
            aria-invalid={errors.baseline ? true : undefined}
          >
            <option value="">keep ({current.baseline ?? "default"})</option>
            <option value="none">none</option>
            <option value="offset">offset below the gap</option>
            <option value="scatter">scatter (a + b·E⁴)</option>
          </select>
          {errors.baseline && (
            <p role="alert" className="mt-0.5 text-xs text-red-700">
              {errors.baseline.join(" ")}
            </p>
          )}
        </div>
        {parents && (
          <div>
            <label htmlFor="rerun-reference" className="text-xs font-medium">
              Parent reference
            </label>
            <ParentPicker
              id="rerun-reference"
              name="referenceChoice"
              value={parentId}
              onChange={setParentId}
              candidates={parents.candidates}
              target={parents.target}
              errors={errors.referenceSpectrumId}
            />
            <input type="hidden" name="referenceSpectrumId" value={parentChanged ? parentId || "none" : ""} />
            {errors.referenceSpectrumId && (
              <p id="referenceChoice-error" role="alert" className="mt-0.5 text-xs text-red-700">
                {errors.referenceSpectrumId.join(" ")}
              </p>
            )}
          </div>
        )}
        <NormalizationFields
          key={answered.count}
          current={current.normalization}
          hasReference={parents ? parentId !== "" : hasReference}
          initialMode={value("normalizationMode")}
          errors={errors}
          field={field}
        />
        <fieldset className="grid grid-cols-2 gap-3">
          <legend className="mb-1 text-xs font-semibold text-ink-soft">Flag thresholds</legend>
          {THRESHOLD_FIELDS.map((f) =>
            field(
              f.name,
              f.label,
              current.thresholds[f.name] !== undefined ? String(current.thresholds[f.name]) : f.hint.replace("default ", ""),
              f.hint,
            ),
          )}
        </fieldset>
        {(errors.form || (!state.ok && state.message)) && (
          <p role="alert" className="text-sm text-red-700">
            {errors.form?.join(" ") ?? state.message}
          </p>
        )}
        {state.ok && state.message && <p className="text-sm text-leaf">{state.message}</p>}
        <button
          type="submit"
          disabled={pending}
          className="rounded-md bg-glow px-3 py-1.5 text-sm font-medium text-white hover:bg-glow-deep disabled:opacity-60"
        >
          {pending ? "Queuing…" : "Re-run analysis"}
        </button>
      </form>
      {state.ok && state.values?.runId && state.values.status !== "done" && (
        <RunProgress key={state.values.runId} spectrumId={spectrumId} runId={state.values.runId} />
      )}
    </div>
  );
}
