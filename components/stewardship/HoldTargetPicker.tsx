"use client";

import { useState } from "react";
import { inputClass } from "@/components/forms/Field";

type Option = { type: "project" | "series" | "sample" | "spectrum"; id: string; label: string };
const KINDS = [
  ["project", "Project"],
  ["series", "Series"],
  ["sample", "Sample"],
  ["spectrum", "Spectrum"],
] as const;

/** Kind first, then the item of that kind; the form posts targetType and targetId. */
export function HoldTargetPicker({ options }: { options: Option[] }) {
  const [kind, setKind] = useState<Option["type"]>("project");
  const list = options.filter((o) => o.type === kind);
  return (
    <>
      <label className="text-sm font-medium">
        Hold on
        <select
          name="targetType"
          value={kind}
          onChange={(e) => setKind(e.target.value as Option["type"])}
          className={`${inputClass} mt-1 w-36`}
        >
          {KINDS.map(([v, l]) => (
            <option key={v} value={v}>
              {l}
            </option>
          ))}
        </select>
      </label>
      <label className="min-w-64 text-sm font-medium">
        Which
        <select key={kind} name="targetId" required defaultValue="" className={`${inputClass} mt-1`}>
          <option value="" disabled>
            Choose a {kind}…
          </option>
          {list.map((o) => (
            <option key={o.id} value={o.id}>
              {o.label}
            </option>
          ))}
        </select>
      </label>
    </>
  );
}
