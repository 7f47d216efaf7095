"use client";

import { inputClass } from "@/components/forms/Field";
import {
  orderParentChoices,
  parentVerdict,
  type ParentCandidate,
  type ParentChoice,
  type ParentTarget,
} from "@/lib/parents/orderParentChoices";
import type { SampleBands } from "@/lib/parents/sampleBands";

/** A file waiting to be uploaded, with the bands its preview found. */
export type WaitingFileBands = { fileName: string; bands: SampleBands };

const reasonText = (reason: string) => reason.replace(/^the reference does not match this sample: /, "");

const TECHNIQUE_WORDS = { absorption: "absorption", pl: "PL", ir: "mid-IR" } as const;

function optionText(c: ParentChoice): string {
  const exciton = c.firstExcitonEv !== null ? ` · 1st exciton ${c.firstExcitonEv.toFixed(3)} eV` : "";
  const refused = c.verdict.ok ? "" : " · does not match";
  return `${c.fileName}${c.sampleName ? ` · ${c.sampleName}` : ""}${exciton} · ${c.createdAt.slice(0, 10)}${refused}`;
}

/**
 * The parent reference picker of the upload and re-run forms: the sample's registered parents'
 * spectra of the same technique first, then other spectra of that technique and material; a
 * choice the engine would refuse (lib/engine/compare/checkReferenceMatch.ts) is named beside the
 * field, with the reason, before anything is sent.
 */
export function ParentPicker({
  id,
  name,
  value,
  onChange,
  candidates,
  target,
  files = [],
  errors,
  disabled,
  noneLabel = "None (analyse on its own)",
}: {
  id: string;
  name: string;
  value: string;
  onChange?: (value: string) => void;
  candidates: readonly ParentCandidate[];
  target: ParentTarget;
  /** Files about to be uploaded (upload form): the chosen parent is checked against each one's own bands. */
  files?: readonly WaitingFileBands[];
  errors?: string[];
  disabled?: boolean;
  noneLabel?: string;
}) {
  const { registered, related } = orderParentChoices(candidates, target);
  const chosen = value ? candidates.find((c) => c.id === value) : undefined;
  const verdict = chosen ? parentVerdict(target, chosen) : null;
  const warning = verdict && !verdict.ok ? reasonText(verdict.reason) : null;
  const fileRefusals =
    chosen && !warning
      ? files.flatMap((f) => {
          const v = parentVerdict({ ...target, bands: f.bands }, chosen);
          return v.ok ? [] : [{ fileName: f.fileName, reason: reasonText(v.reason) }];
        })
      : [];
  const listed = [...registered, ...related].some((c) => c.id === value);
  const noteId = `${id}-match`;
  const refused = warning !== null || fileRefusals.length > 0;
  const describedBy = [errors?.length ? `${name}-error` : null, refused ? noteId : null].filter(Boolean).join(" ") || undefined;
  return (
    <div>
      <select
        id={id}
        name={name}
        value={value}
        disabled={disabled}
        className={inputClass}
        onChange={(e) => onChange?.(e.target.value)}
        aria-invalid={errors?.length || refused ? true : undefined}
        aria-describedby={describedBy}
      >
        <option value="">{noneLabel}</option>
        {chosen && !listed && (
          <option value={chosen.id}>
            {chosen.fileName} ({TECHNIQUE_WORDS[chosen.technique]})
          </option>
        )}
        {registered.length > 0 && (
          <optgroup label={`Registered parents of ${target.sample?.name ?? "the sample"}`}>
            {registered.map((c) => (
              <option key={c.id} value={c.id}>
                {optionText(c)}
              </option>
            ))}
          </optgroup>
        )}
        {related.length > 0 && (
          <optgroup
            label={
              target.sample
                ? `Other ${TECHNIQUE_WORDS[target.technique]} spectra of ${target.sample.material}`
                : `Other ${TECHNIQUE_WORDS[target.technique]} spectra of this project`
            }
          >
            {related.map((c) => (
              <option key={c.id} value={c.id}>
                {optionText(c)}
              </option>
            ))}
          </optgroup>
        )}
      </select>
      {target.sample && registered.length === 0 && (
        <p className="mt-1 text-xs text-ink-faint">
          No {TECHNIQUE_WORDS[target.technique]} spectrum of {target.sample.name}&apos;s registered parents yet.
        </p>
      )}
      {warning && (
        <p id={noteId} role="alert" data-testid="parent-mismatch" className="mt-1 text-sm text-amber-800">
          The analysis will refuse this parent: {warning}.
        </p>
      )}
      {fileRefusals.length > 0 && (
        <div id={noteId} role="alert" data-testid="parent-mismatch" className="mt-1 space-y-0.5 text-sm text-amber-800">
          {fileRefusals.map((r) => (
            <p key={r.fileName}>
              The analysis will refuse this parent for {r.fileName}: {r.reason}.
            </p>
          ))}
        </div>
      )}
    </div>
  );
}
