"use client";

import { Field, inputClass } from "@/components/forms/Field";
import { TECHNIQUE_LABELS } from "@/lib/registry/techniques";
import { HazardNotice } from "@/components/ui/HazardNotice";
import { ParentPicker, type WaitingFileBands } from "@/components/parents/ParentPicker";
import type { Technique } from "@/lib/engine";
import { hazardsOf } from "@/lib/hazards";
import { INGEST_MATERIALS, INGEST_TECHNIQUES } from "@/lib/ingest/metadata";
import type { UploadChoices } from "@/lib/queries/spectrum-status";
import { X_UNITS, X_UNIT_NAMES, Y_KINDS, Y_KIND_NAMES } from "@/lib/engine/parse/readChoice";
import type { ImportProfileView } from "@/lib/ingest/profiles/importProfiles";

export type BatchValues = {
  projectId: string;
  technique: string;
  sampleId: string;
  referenceSpectrumId: string;
  seriesId: string;
  seriesValue: string;
  pathLengthCm: string;
  excitationNm: string;
  solvent: string;
  column: string;
  material: string;
  xUnit: string;
  yKind: string;
  block: string;
  pair: string;
  sheet: string;
  split: string;
  profile: string;
  onDuplicate: string;
};

export const EMPTY_VALUES: BatchValues = {
  projectId: "",
  technique: "absorption",
  sampleId: "",
  referenceSpectrumId: "",
  seriesId: "",
  seriesValue: "",
  pathLengthCm: "1",
  excitationNm: "",
  solvent: "",
  column: "",
  material: "",
  xUnit: "",
  yKind: "",
  block: "",
  pair: "",
  sheet: "",
  split: "",
  profile: "",
  onDuplicate: "",
};

type Props = {
  choices: UploadChoices;
  values: BatchValues;
  errors: Partial<Record<keyof BatchValues, string[]>>;
  disabled: boolean;
  onChange: (values: BatchValues) => void;
  /** The bands the previews found in the files waiting to be uploaded. */
  waitingFiles?: readonly WaitingFileBands[];
  /** The chosen project's import profiles, and how to delete one. */
  profiles?: readonly ImportProfileView[];
  onDeleteProfile?: (id: string) => void;
};

/** The metadata applied to every file of the batch. */
export function BatchForm({ choices, values, errors, disabled, onChange, waitingFiles = [], profiles = [], onDeleteProfile }: Props) {
  const project = choices.projects.find((p) => p.id === values.projectId);
  const sample = project?.samples.find((s) => s.id === values.sampleId);
  const series = project?.series.find((s) => s.id === values.seriesId);
  const set = (key: keyof BatchValues) => (e: { target: { value: string } }) => {
    const next = { ...values, [key]: e.target.value };
    if (key === "projectId") Object.assign(next, { sampleId: "", seriesId: "", seriesValue: "", referenceSpectrumId: "" });
    if (key === "sampleId") {
      const s = project?.samples.find((x) => x.id === e.target.value);
      if (s && !values.solvent) next.solvent = s.solvent;
    }
    onChange(next);
  };
  const attrs = (key: keyof BatchValues) => ({
    id: key,
    name: key,
    value: values[key],
    onChange: set(key),
    disabled,
    "aria-invalid": errors[key]?.length ? true : undefined,
    className: inputClass,
  });

  return (
    <fieldset className="grid grid-cols-1 gap-x-4 gap-y-3 md:grid-cols-2 xl:grid-cols-3" disabled={disabled}>
      <legend className="sr-only">Metadata for every file in this batch</legend>
      <Field name="projectId" label="Project" errors={errors.projectId}>
        <select {...attrs("projectId")}>
          <option value="">Choose a project…</option>
          {choices.projects.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name} ({p.groupName})
            </option>
          ))}
        </select>
      </Field>
      <Field name="technique" label="Technique" errors={errors.technique}>
        <select {...attrs("technique")}>
          {INGEST_TECHNIQUES.map((t) => (
            <option key={t} value={t}>
              {TECHNIQUE_LABELS[t]}
            </option>
          ))}
        </select>
      </Field>
      <Field name="sampleId" label="Sample" hint="Optional; material and solvent come from it" errors={errors.sampleId}>
        <select {...attrs("sampleId")}>
          <option value="">
            {project ? (project.samples.length ? "No sample" : "No samples registered yet") : "Choose a project first"}
          </option>
          {project?.samples.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name} · {s.material}
            </option>
          ))}
        </select>
      </Field>
      <Field
        name="referenceSpectrumId"
        label="Parent reference spectrum"
        hint="Compared against to flag bleach, new bands, quench, shifts"
        errors={errors.referenceSpectrumId}
      >
        <ParentPicker
          id="referenceSpectrumId"
          name="referenceSpectrumId"
          value={values.referenceSpectrumId}
          disabled={disabled}
          onChange={(v) => set("referenceSpectrumId")({ target: { value: v } })}
          errors={errors.referenceSpectrumId}
          candidates={project?.references ?? []}
          files={waitingFiles}
          target={{
            technique: values.technique as Technique,
            sample: sample ? { id: sample.id, name: sample.name, material: sample.material, parentIds: sample.parentIds } : null,
            side: null,
          }}
        />
      </Field>
      <Field name="seriesId" label="Series" errors={errors.seriesId}>
        <select {...attrs("seriesId")}>
          <option value="">Not part of a series</option>
          {project?.series.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </select>
      </Field>
      <Field
        name="seriesValue"
        label={
          series?.variableName
            ? `Series value: ${series.variableName}${series.variableUnit ? ` (${series.variableUnit})` : ""}`
            : "Series value"
        }
        errors={errors.seriesValue}
      >
        <input
          {...attrs("seriesValue")}
          inputMode="decimal"
          disabled={disabled || !values.seriesId}
          placeholder={values.seriesId ? "e.g. 0.5" : "choose a series first"}
        />
      </Field>
      <Field name="pathLengthCm" label="Path length (cm)" errors={errors.pathLengthCm}>
        <input {...attrs("pathLengthCm")} inputMode="decimal" />
      </Field>
      <Field name="excitationNm" label="Excitation wavelength (nm)" hint="For photoluminescence" errors={errors.excitationNm}>
        <input {...attrs("excitationNm")} inputMode="decimal" />
      </Field>
      <Field name="solvent" label="Solvent" errors={errors.solvent}>
        <input {...attrs("solvent")} maxLength={100} />
      </Field>
      <Field name="column" label="Signal column" hint="Header name or number; empty: the first signal column" errors={errors.column}>
        <input {...attrs("column")} maxLength={100} />
      </Field>
      <Field name="xUnit" label="X unit" hint="Empty: as the header says, or inferred from the values" errors={errors.xUnit}>
        <select {...attrs("xUnit")}>
          <option value="">As the file says</option>
          {X_UNIT_NAMES.map((u) => (
            <option key={u} value={u}>
              {X_UNITS[u].label}
            </option>
          ))}
        </select>
      </Field>
      <Field name="yKind" label="Signal kind" hint="Empty: as the file or technique says" errors={errors.yKind}>
        <select {...attrs("yKind")}>
          <option value="">As the file says</option>
          {Y_KIND_NAMES.map((k) => (
            <option key={k} value={k}>
              {Y_KINDS[k].label}
            </option>
          ))}
        </select>
      </Field>
      <Field name="block" label="Block" hint="For files with several blocks one after another; empty: the first" errors={errors.block}>
        <input {...attrs("block")} inputMode="numeric" />
      </Field>
      <Field name="pair" label="X,Y pair" hint="For files with X,Y pairs side by side" errors={errors.pair}>
        <input {...attrs("pair")} inputMode="numeric" />
      </Field>
      <Field name="sheet" label="Spreadsheet sheet" hint="Name or number; empty: the first sheet with numbers" errors={errors.sheet}>
        <input {...attrs("sheet")} maxLength={100} />
      </Field>
      <Field
        name="split"
        label="Several columns in one file"
        hint="One spectrum per Y column, pair or block; a header such as “0.5 eq” gives its series value"
        errors={errors.split}
      >
        <select {...attrs("split")}>
          <option value="">One spectrum (the column chosen)</option>
          <option value="all">Split into one spectrum per column</option>
        </select>
      </Field>
      <Field
        name="profile"
        label="Import profile"
        hint="Saved ways of reading files; empty: the profile whose header matches the file"
        errors={errors.profile}
      >
        <select {...attrs("profile")}>
          <option value="">{profiles.length ? "Matched by the file's header" : "No profiles saved yet"}</option>
          <option value="none">None (read as chosen here)</option>
          {profiles.map((p) => (
            <option key={p.id} value={p.name}>
              {p.name}
            </option>
          ))}
        </select>
        {profiles.length > 0 && (
          <ul className="mt-1 space-y-0.5 text-xs text-ink-soft" data-testid="profile-list">
            {profiles.map((p) => (
              <li key={p.id} className="flex items-center gap-2">
                <span className="truncate">{p.name}</span>
                {onDeleteProfile && (
                  <button
                    type="button"
                    disabled={disabled}
                    onClick={() => onDeleteProfile(p.id)}
                    className="text-red-800 hover:underline"
                    aria-label={`Delete profile ${p.name}`}
                  >
                    delete
                  </button>
                )}
              </li>
            ))}
          </ul>
        )}
      </Field>
      <Field
        name="onDuplicate"
        label="A file stored before, with other details"
        hint="The same bytes again: the stored spectrum is linked, never stored twice"
        errors={errors.onDuplicate}
      >
        <select {...attrs("onDuplicate")}>
          <option value="">Keep the stored details (tell me what differs)</option>
          <option value="update">Update the stored details (re-analysed if needed)</option>
        </select>
      </Field>
      <Field name="material" label="Core material for sizing" hint="Empty: taken from the sample" errors={errors.material}>
        <select {...attrs("material")}>
          <option value="">From the sample</option>
          {INGEST_MATERIALS.map((m) => (
            <option key={m} value={m}>
              {m}
            </option>
          ))}
        </select>
      </Field>
      {sample && (
        <div className="md:col-span-2 xl:col-span-3">
          <HazardNotice
            flags={hazardsOf({ material: sample.material, coreShell: sample.coreShell, solvent: values.solvent || sample.solvent })}
          />
        </div>
      )}
    </fieldset>
  );
}
