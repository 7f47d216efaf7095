"use client";

import { useActionState } from "react";
import { createSeries } from "@/app/(app)/series/actions";
import { initialActionState } from "@/lib/actions/protected-state";
import { Field, inputClass } from "@/components/forms/Field";

const KINDS = [
  ["titration", "Titration"],
  ["shell-thickness", "Shell thickness"],
  ["time", "Time"],
  ["other", "Other"],
] as const;

export function SeriesForm({ projects }: { projects: { id: string; name: string; groupName: string }[] }) {
  const [state, action, pending] = useActionState(createSeries, initialActionState);
  const v = state.values ?? {};
  const err = (f: string) => state.fieldErrors?.[f];
  const aria = (f: string) => (err(f) ? { "aria-invalid": true as const } : {});
  return (
    <form action={action} className="max-w-xl space-y-4 rounded-lg border border-stone-200 bg-white p-5">
      <Field name="projectId" label="Project" errors={err("projectId")}>
        <select
          id="projectId"
          name="projectId"
          defaultValue={v.projectId ?? projects[0]?.id ?? ""}
          className={inputClass}
          {...aria("projectId")}
        >
          {projects.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name} ({p.groupName})
            </option>
          ))}
        </select>
      </Field>
      <Field name="name" label="Name" errors={err("name")}>
        <input id="name" name="name" defaultValue={v.name ?? ""} className={inputClass} {...aria("name")} />
      </Field>
      <Field name="kind" label="Kind" errors={err("kind")}>
        <select id="kind" name="kind" defaultValue={v.kind ?? "titration"} className={inputClass} {...aria("kind")}>
          {KINDS.map(([k, l]) => (
            <option key={k} value={k}>
              {l}
            </option>
          ))}
        </select>
      </Field>
      <div className="grid grid-cols-2 gap-4">
        <Field name="variableName" label="Variable" hint="What changes along the series" errors={err("variableName")}>
          <input
            id="variableName"
            name="variableName"
            defaultValue={v.variableName ?? ""}
            placeholder="PbS per CdSe"
            className={inputClass}
            {...aria("variableName")}
          />
        </Field>
        <Field name="variableUnit" label="Unit" hint="Blank for a ratio without unit" errors={err("variableUnit")}>
          <input
            id="variableUnit"
            name="variableUnit"
            defaultValue={v.variableUnit ?? ""}
            placeholder="equivalents"
            className={inputClass}
            {...aria("variableUnit")}
          />
        </Field>
      </div>
      <div className="flex items-center gap-3">
        <button
          disabled={pending}
          className="rounded-md bg-glow px-3 py-2 text-sm font-medium text-white hover:bg-glow-deep disabled:opacity-60"
        >
          Create series
        </button>
        {state.message && !state.ok && (
          <span role="alert" className="text-sm text-red-700">
            {state.message}
          </span>
        )}
      </div>
    </form>
  );
}
