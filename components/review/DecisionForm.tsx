"use client";

import { useActionState, useOptimistic } from "react";
import { decideAction, undoAction } from "@/app/(app)/review/actions";
import { initialActionState } from "@/lib/actions/protected-state";
import { StatusBadge } from "@/components/ui/StatusBadge";

/**
 * Confirm or dismiss one signature with a comment; a decided one can be changed to the other
 * decision (its history stays) or its last decision undone (back to the state before it).
 */
export function DecisionForm({
  signatureId,
  reviewState,
  undoableReviewId,
}: {
  signatureId: string;
  reviewState: string;
  undoableReviewId: string | null;
}) {
  const [state, formAction, pending] = useActionState(decideAction, initialActionState);
  const [undoState, undoFormAction, undoing] = useActionState(undoAction, initialActionState);
  const [shown, setShown] = useOptimistic(reviewState, (_: string, next: string) => next);
  const submit = (formData: FormData) => {
    setShown(String(formData.get("decision") ?? reviewState));
    formAction(formData);
  };
  const error = state.fieldErrors?.comment?.join(" ") ?? state.fieldErrors?.decision?.join(" ");
  const result = undoState.message && !pending ? undoState : state;
  return (
    <form action={submit} className="space-y-3" aria-label="Decision">
      <input type="hidden" name="signatureIds" value={signatureId} />
      <p className="text-sm">
        Now:{" "}
        <span data-testid="review-state">
          <StatusBadge status={shown} />
        </span>
      </p>
      <div>
        <label htmlFor="decision-comment" className="text-sm font-medium">
          Comment
        </label>
        <textarea
          id="decision-comment"
          name="comment"
          rows={3}
          maxLength={2000}
          defaultValue={state.ok ? "" : (state.values?.comment ?? "")}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? "decision-error" : undefined}
          placeholder="What you looked at and why you decide so"
          className="mt-1 block w-full rounded-md border border-stone-300 px-2 py-1.5 text-sm"
        />
        {error && (
          <p id="decision-error" role="alert" className="mt-1 text-sm text-red-700">
            {error}
          </p>
        )}
      </div>
      <div className="flex flex-wrap gap-2">
        {reviewState !== "confirmed" && (
          <button
            name="decision"
            value="confirmed"
            disabled={pending || undoing}
            className="rounded-md bg-leaf px-3 py-1.5 text-sm font-medium text-white hover:opacity-90 disabled:opacity-50"
          >
            {reviewState === "awaiting" ? "Confirm" : "Change to confirmed"}
          </button>
        )}
        {reviewState !== "dismissed" && (
          <button
            name="decision"
            value="dismissed"
            disabled={pending || undoing}
            className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm font-medium hover:bg-stone-50 disabled:opacity-50"
          >
            {reviewState === "awaiting" ? "Dismiss" : "Change to dismissed"}
          </button>
        )}
        {undoableReviewId && (
          <button
            type="submit"
            formAction={undoFormAction}
            name="reviewIds"
            value={undoableReviewId}
            disabled={pending || undoing}
            className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-50 disabled:opacity-50"
          >
            Undo the last decision
          </button>
        )}
      </div>
      <p role="status" className={`min-h-5 text-sm ${result.ok ? "text-leaf" : "text-red-700"}`}>
        {result.message}
      </p>
    </form>
  );
}
