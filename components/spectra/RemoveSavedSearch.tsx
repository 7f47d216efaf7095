"use client";

import { useState } from "react";
import { ActionForm } from "@/components/forms/ActionForm";
import { deleteSavedSearchAction } from "@/app/(app)/spectra/actions-search";

/** Removes a saved search after a second, explicit click (the first only asks). */
export function RemoveSavedSearch({ id, name }: { id: string; name: string }) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <button
        type="button"
        onClick={() => setAsking(true)}
        aria-label={`Remove saved search ${name}`}
        className="rounded-md px-2 py-0.5 text-xs text-ink-soft hover:bg-stone-100 hover:text-red-700"
      >
        Remove
      </button>
    );
  }
  return (
    <div className="flex items-center gap-2" role="group" aria-label={`Confirm removing ${name}`}>
      <span className="text-xs text-ink-soft">Remove “{name}”?</span>
      <ActionForm
        action={deleteSavedSearchAction}
        submit="Remove"
        pendingLabel="Removing…"
        danger
        label={`Remove ${name}`}
        className="flex items-center gap-2"
      >
        <input type="hidden" name="id" value={id} />
      </ActionForm>
      <button
        type="button"
        onClick={() => setAsking(false)}
        className="rounded-md border border-stone-300 px-2.5 py-1 text-xs hover:bg-stone-50"
      >
        Keep
      </button>
    </div>
  );
}
