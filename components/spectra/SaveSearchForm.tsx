"use client";

import { ActionForm } from "@/components/forms/ActionForm";
import { saveSearchAction } from "@/app/(app)/spectra/actions-search";

/** Names the current search and keeps it for the Overview. */
export function SaveSearchForm({ query }: { query: string }) {
  return (
    <ActionForm
      action={saveSearchAction}
      submit="Save search"
      pendingLabel="Saving…"
      label="Save this search"
      className="mb-4 flex flex-wrap items-end gap-2"
    >
      <input type="hidden" name="query" value={query} />
      <label className="text-xs text-ink-soft">
        Name this search
        <br />
        <input
          name="name"
          required
          maxLength={120}
          placeholder="e.g. CdSe first exciton 570–590 nm"
          className="w-72 rounded-md border border-stone-300 px-2 py-1.5 text-sm"
        />
      </label>
    </ActionForm>
  );
}
