"use client";

import { useActionState } from "react";
import { deleteSpectrumAction } from "@/app/(app)/spectra/actions-delete";
import { initialActionState } from "@/lib/actions/protected-state";
import { inputClass } from "@/components/forms/Field";

/** Delete-a-spectrum form for the spectrum page; a refusal (legal hold, reference) shows its reason. */
export function DeleteSpectrumForm({ spectrumId, heldReason }: { spectrumId: string; heldReason?: string | null }) {
  const [state, action, pending] = useActionState(deleteSpectrumAction, initialActionState);
  return (
    <form action={action} className="space-y-2 rounded-lg border border-red-200 bg-white p-3" aria-label="Delete spectrum">
      <input type="hidden" name="spectrumId" value={spectrumId} />
      <p className="text-sm font-medium">Delete this spectrum</p>
      <p className="text-xs text-ink-soft">
        Removes the raw file, the spectrum and its analyses. A tombstone (name, time, sha256) and the audit trail remain.
      </p>
      {heldReason && (
        <p className="rounded-md border border-caution/40 bg-caution-soft px-2 py-1 text-xs">Under legal hold: {heldReason}</p>
      )}
      <div className="flex items-start gap-2">
        <input
          name="confirm"
          aria-label="Type delete to confirm"
          placeholder="type delete"
          aria-invalid={!!state.fieldErrors?.confirm}
          className={`${inputClass} w-40`}
        />
        <button
          disabled={pending}
          className="rounded-md bg-red-700 px-3 py-1.5 text-sm font-medium text-white hover:bg-red-800 disabled:opacity-60"
        >
          {pending ? "Deleting…" : "Delete"}
        </button>
      </div>
      {state.message && !state.ok && (
        <p role="alert" className="text-sm text-red-700">
          {state.fieldErrors?.confirm?.join(" ") ?? state.message}
        </p>
      )}
    </form>
  );
}
