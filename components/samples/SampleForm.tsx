"use client";

import { useActionState, useState } from "react";
import { registerSample } from "@/app/(app)/samples/actions";
import { initialActionState } from "@/lib/actions/protected-state";
import { hazardsOf } from "@/lib/hazards";
import { Field, inputClass } from "@/components/forms/Field";
import { HazardNotice } from "@/components/ui/HazardNotice";

type Choice = { id: string; name: string; groupId: string };

export function SampleForm({
  groups,
  projects,
  samples,
}: {
  groups: { id: string; name: string }[];
  projects: Choice[];
  samples: Choice[];
}) {
  const [state, action, pending] = useActionState(registerSample, initialActionState);
  const v = state.values ?? {};
  const [groupId, setGroupId] = useState(v.groupId ?? groups[0]?.id ?? "");
  const [material, setMaterial] = useState(v.material ?? "");
  const [coreShell, setCoreShell] = useState(v.coreShell ?? "");
  const [solvent, setSolvent] = useState(v.solvent ?? "");
  const [ligand, setLigand] = useState(v.ligand ?? "");
  const e = state.fieldErrors ?? {};
  const hazards = hazardsOf({ material, coreShell, ligand, solvent });

  return (
    <form action={action} className="grid max-w-3xl gap-4 md:grid-cols-2" noValidate>
      <Field name="groupId" label="Group" errors={e.groupId}>
        <select id="groupId" name="groupId" value={groupId} onChange={(ev) => setGroupId(ev.target.value)} className={inputClass}>
          {groups.map((g) => (
            <option key={g.id} value={g.id}>
              {g.name}
            </option>
          ))}
        </select>
      </Field>
      <Field name="projectId" label="Project" hint="Optional" errors={e.projectId}>
        <select id="projectId" name="projectId" defaultValue={v.projectId ?? ""} className={inputClass}>
          <option value="">—</option>
          {projects
            .filter((p) => p.groupId === groupId)
            .map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
        </select>
      </Field>
      <Field name="name" label="Batch name" errors={e.name}>
        <input id="name" name="name" defaultValue={v.name} aria-invalid={!!e.name} className={inputClass} />
      </Field>
      <Field name="material" label="Material" hint="For example CdSe, PbS, InP" errors={e.material}>
        <input
          id="material"
          name="material"
          value={material}
          onChange={(ev) => setMaterial(ev.target.value)}
          aria-invalid={!!e.material}
          className={inputClass}
        />
      </Field>
      <Field name="coreShell" label="Core/shell" hint="For example CdSe/ZnS, 3 monolayers" errors={e.coreShell}>
        <input id="coreShell" name="coreShell" value={coreShell} onChange={(ev) => setCoreShell(ev.target.value)} className={inputClass} />
      </Field>
      <Field name="ligand" label="Ligand" errors={e.ligand}>
        <input id="ligand" name="ligand" value={ligand} onChange={(ev) => setLigand(ev.target.value)} className={inputClass} />
      </Field>
      <Field name="solvent" label="Solvent" errors={e.solvent}>
        <input id="solvent" name="solvent" value={solvent} onChange={(ev) => setSolvent(ev.target.value)} className={inputClass} />
      </Field>
      <Field name="parentIds" label="Parent samples" hint="A product made from two batches lists both (Ctrl/⌘-click)" errors={e.parentIds}>
        <select id="parentIds" name="parentIds" multiple size={4} className={inputClass}>
          {samples
            .filter((s) => s.groupId === groupId)
            .map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
        </select>
      </Field>
      <div className="md:col-span-2">
        <Field name="notes" label="Notes" errors={e.notes}>
          <textarea id="notes" name="notes" rows={3} defaultValue={v.notes} className={inputClass} />
        </Field>
      </div>
      {hazards.length > 0 && (
        <div className="md:col-span-2">
          <HazardNotice flags={hazards} />
        </div>
      )}
      <div className="flex items-center gap-3 md:col-span-2">
        <button
          type="submit"
          disabled={pending}
          className="rounded-md bg-glow px-4 py-2 text-sm font-medium text-white hover:bg-glow-deep disabled:opacity-60"
        >
          {pending ? "Registering…" : "Register sample"}
        </button>
        {state.message && !state.ok && (
          <p role="status" className="text-sm text-red-700">
            {state.message}
          </p>
        )}
      </div>
    </form>
  );
}
