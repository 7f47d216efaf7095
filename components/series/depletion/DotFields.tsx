"use client";

import { HazardNotice } from "@/components/ui/HazardNotice";
import { MATERIALS } from "@/lib/engine/derived/materials";
import type { MaterialName } from "@/lib/engine/types";
import { hazardsOf } from "@/lib/hazards";
import type { PureCandidate } from "@/lib/queries/series-depletion";

export type DotState = { material: MaterialName; nm: string; pure: string };

const input = "rounded-md border border-stone-300 px-2 py-1 text-sm aria-[invalid=true]:border-red-500";
const names = Object.keys(MATERIALS) as MaterialName[];

/** Material, first exciton and spectrum of the pure dot for dot A or X; choosing a spectrum fills what its analysis knows. */
export function DotFields({
  label,
  value,
  onChange,
  candidates,
  invalidNm,
}: {
  label: "A" | "X";
  value: DotState;
  onChange: (v: DotState) => void;
  candidates: PureCandidate[];
  invalidNm: boolean;
}) {
  const choosePure = (id: string) => {
    const c = candidates.find((x) => x.spectrumId === id);
    onChange({
      pure: id,
      material: c?.material ?? value.material,
      nm: c?.firstExcitonNm ? c.firstExcitonNm.toFixed(1) : value.nm,
    });
  };
  const id = (f: string) => `depletion-${label}-${f}`;
  return (
    <fieldset className="flex flex-wrap items-end gap-2 rounded-md border border-stone-200 px-3 py-2">
      <legend className="px-1 text-xs font-semibold text-ink">Dot {label}</legend>
      <label htmlFor={id("material")}>
        material
        <br />
        <select
          id={id("material")}
          className={input}
          value={value.material}
          onChange={(e) => onChange({ ...value, material: e.target.value as MaterialName })}
        >
          {names.map((n) => (
            <option key={n}>{n}</option>
          ))}
        </select>
      </label>
      <label htmlFor={id("nm")}>
        first exciton (nm)
        <br />
        <input
          id={id("nm")}
          className={`${input} w-24`}
          inputMode="decimal"
          value={value.nm}
          aria-invalid={invalidNm || undefined}
          onChange={(e) => onChange({ ...value, nm: e.target.value })}
        />
      </label>
      <label htmlFor={id("pure")}>
        spectrum of pure {label} (for the overlap)
        <br />
        <select id={id("pure")} className={`${input} max-w-64`} value={value.pure} onChange={(e) => choosePure(e.target.value)}>
          <option value="">none: no overlap correction</option>
          {candidates.map((c) => (
            <option key={c.spectrumId} value={c.spectrumId}>
              {c.fileName}
              {c.sampleName ? ` (${c.sampleName})` : ""}
            </option>
          ))}
        </select>
      </label>
      <HazardNotice flags={hazardsOf({ material: value.material })} compact />
    </fieldset>
  );
}
