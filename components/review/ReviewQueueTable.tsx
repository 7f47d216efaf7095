"use client";

import Link from "next/link";
import { useActionState, useOptimistic, useState } from "react";
import { decideAction, undoAction } from "@/app/(app)/review/actions";
import { initialActionState } from "@/lib/actions/protected-state";
import type { ReviewItem } from "@/lib/queries/review";
import { kindLabel } from "@/lib/registry/flagKinds";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { formatFlagMagnitude } from "@/lib/format/quantity";
import { TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import { formatPosition } from "@/lib/spectrum-view/axis";
import { formatWhen } from "@/lib/format/dates";

export type SortHeader = { key: string; label: string; href: string; active: "asc" | "desc" | null };

/**
 * The queue: checkbox selection and one decision with a comment for the whole selection. Rows
 * change state at once (optimistic); the server's answer appears beside the buttons. A batch can
 * be undone right after: each signature returns to the state it had, and the history says so.
 */
export function ReviewQueueTable({ items, headers }: { items: ReviewItem[]; headers: SortHeader[] }) {
  const [state, formAction, pending] = useActionState(decideAction, initialActionState);
  const [undoState, undoFormAction, undoing] = useActionState(undoAction, initialActionState);
  const [optimistic, markDecided] = useOptimistic(items, (current, change: { ids: string[]; decision: string }) =>
    current.map((i) => (change.ids.includes(i.id) ? { ...i, reviewState: change.decision } : i)),
  );
  const [selected, setSelected] = useState<string[]>([]);
  const [undone, setUndone] = useState<string[] | undefined>(undefined);
  const allSelected = selected.length > 0 && selected.length === items.length;

  const submit = (formData: FormData) => {
    const ids = formData.getAll("signatureIds").map(String);
    const decision = String(formData.get("decision") ?? "");
    markDecided({ ids, decision });
    setSelected([]);
    formAction(formData);
  };
  const undo = (formData: FormData) => {
    setUndone(state.written);
    undoFormAction(formData);
  };
  // The undo answer belongs to the batch it undid; a newer decision shows its own answer.
  const showUndo = undone !== undefined && undone === state.written && undoState.message;
  const result = showUndo ? undoState : state;
  const canUndo = state.ok && (state.written?.length ?? 0) > 0 && !pending && !showUndo;

  return (
    <div>
      <form action={submit} aria-label="Decide on the selected signatures">
        <div className="mb-3 flex flex-wrap items-end gap-3 rounded-lg border border-stone-200 bg-white p-3">
          <label className="min-w-64 flex-1 text-xs text-ink-soft" htmlFor="batch-comment">
            Comment for the selected signatures
            <textarea
              id="batch-comment"
              name="comment"
              rows={1}
              maxLength={2000}
              placeholder="Why you confirm or dismiss them (kept in the history)"
              className="mt-1 block w-full rounded-md border border-stone-300 px-2 py-1.5 text-sm text-ink"
            />
          </label>
          <span className="text-sm text-ink-soft" aria-live="polite">
            {selected.length} selected
          </span>
          <button
            name="decision"
            value="confirmed"
            disabled={pending || selected.length === 0}
            className="rounded-md bg-leaf px-2 py-1.5 text-sm font-medium text-white hover:opacity-90 disabled:opacity-40"
          >
            Confirm selected
          </button>
          <button
            name="decision"
            value="dismissed"
            disabled={pending || selected.length === 0}
            className="rounded-md border border-stone-300 bg-white px-2 py-1.5 text-sm font-medium hover:bg-stone-50 disabled:opacity-40"
          >
            Dismiss selected
          </button>
          <div className="flex min-h-8 w-full flex-wrap items-center gap-3 text-sm" role="status" data-testid="batch-result">
            {result.message && <span className={result.ok ? "text-leaf" : "text-red-700"}>{result.message}</span>}
            {canUndo && (
              <button
                type="submit"
                formAction={undo}
                disabled={undoing}
                name="reviewIds"
                value={(state.written ?? []).join(",")}
                className="rounded-md border border-stone-300 bg-white px-2 py-1 text-xs hover:bg-stone-50 disabled:opacity-40"
              >
                Undo this decision
              </button>
            )}
          </div>
        </div>
        <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm" data-testid="review-queue">
            <thead className="bg-stone-100 text-left text-xs text-ink-soft">
              <tr>
                <th className="w-8 px-2 py-2">
                  <input
                    type="checkbox"
                    aria-label="Select every signature on this page"
                    checked={allSelected}
                    onChange={(e) => setSelected(e.target.checked ? items.map((i) => i.id) : [])}
                  />
                </th>
                {headers.map((h) => (
                  <th
                    key={h.key}
                    className="whitespace-nowrap px-2 py-2"
                    aria-sort={h.active === "asc" ? "ascending" : h.active === "desc" ? "descending" : undefined}
                  >
                    {h.href ? (
                      <Link prefetch={false} href={h.href} className="hover:text-ink">
                        {h.label}
                        {h.active === "asc" ? " ▲" : h.active === "desc" ? " ▼" : ""}
                      </Link>
                    ) : (
                      h.label
                    )}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody className="tabular">
              {optimistic.map((i) => (
                <tr key={i.id} className="border-t border-stone-100 hover:bg-stone-50" data-signature-id={i.id}>
                  <td className="px-2 py-1.5">
                    <input
                      type="checkbox"
                      name="signatureIds"
                      value={i.id}
                      aria-label={`Select ${kindLabel(i.kind, i.technique)} in ${i.fileName}`}
                      checked={selected.includes(i.id)}
                      onChange={(e) => setSelected((s) => (e.target.checked ? [...s, i.id] : s.filter((x) => x !== i.id)))}
                    />
                  </td>
                  <td className="whitespace-nowrap px-2 py-1.5 font-medium">
                    <Link prefetch={false} className="text-glow-deep hover:underline" href={`/review/${i.id}`}>
                      {kindLabel(i.kind, i.technique)}
                    </Link>
                  </td>
                  <td className="px-2 py-1.5">{i.significance.toFixed(1)}σ</td>
                  <td className="whitespace-nowrap px-2 py-1.5">
                    {formatFlagMagnitude(i)}
                    {i.energyEv !== null && (
                      <span className="block text-xs text-ink-faint">
                        {formatPosition(i.energyEv, TECHNIQUE_SPECS[i.technique].defaultAxis === "cm-1" ? "cm-1" : "ev")}
                      </span>
                    )}
                  </td>
                  <td className="max-w-48 truncate px-2 py-1.5">
                    <Link prefetch={false} className="hover:underline" href={`/spectra/${i.spectrumId}`}>
                      {i.fileName}
                    </Link>
                  </td>
                  <td className="whitespace-nowrap px-2 py-1.5">{i.sampleName ?? "—"}</td>
                  <td className="max-w-40 px-2 py-1.5 text-xs text-ink-soft">{i.projectName}</td>
                  <td className="whitespace-nowrap px-2 py-1.5 text-ink-soft">{formatWhen(i.createdAt).replace(/ UTC$/, "")}</td>
                  <td className="whitespace-nowrap px-2 py-1.5">
                    <StatusBadge status={i.reviewState} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </form>
    </div>
  );
}
