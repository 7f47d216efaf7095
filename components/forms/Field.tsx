import type { ReactNode } from "react";

/** A labelled field with its error beside it, wired for screen readers. */
export function Field({
  name,
  label,
  hint,
  errors,
  children,
}: {
  name: string;
  label: string;
  hint?: string;
  errors?: string[];
  children: ReactNode;
}) {
  const errorId = `${name}-error`;
  return (
    <div className="block">
      <label htmlFor={name} className="text-sm font-medium">
        {label}
      </label>
      {hint && <p className="text-xs text-ink-faint">{hint}</p>}
      <div className="mt-1" aria-describedby={errors?.length ? errorId : undefined}>
        {children}
      </div>
      {errors?.length ? (
        <p id={errorId} role="alert" className="mt-1 text-sm text-red-700">
          {errors.join(" ")}
        </p>
      ) : null}
    </div>
  );
}

export const inputClass =
  "w-full rounded-md border border-stone-300 px-3 py-1.5 text-sm focus:border-glow focus:outline-none focus:ring-2 focus:ring-glow/30 aria-[invalid=true]:border-red-500";
