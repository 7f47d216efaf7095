"use client";

import { useActionState } from "react";
import { saveNotifications } from "@/app/(app)/settings/actions";
import { initialActionState } from "@/lib/actions/protected-state";

export function NotificationForm({ notifyDigest, notifyDecisions }: { notifyDigest: boolean; notifyDecisions: boolean }) {
  const [state, action, pending] = useActionState(saveNotifications, initialActionState);
  return (
    <form action={action} className="space-y-2 text-sm">
      <label className="flex items-center gap-2">
        <input type="checkbox" name="notifyDigest" defaultChecked={notifyDigest} /> E-mail me a digest of new signatures to review (group
        leads)
      </label>
      <label className="flex items-center gap-2">
        <input type="checkbox" name="notifyDecisions" defaultChecked={notifyDecisions} /> E-mail me when a lead decides on a signature in my
        uploads
      </label>
      <div className="flex items-center gap-3">
        <button
          disabled={pending}
          className="rounded-md border border-stone-300 bg-white px-3 py-1.5 hover:bg-stone-50 disabled:opacity-60"
        >
          Save
        </button>
        {state.message && (
          <span role="status" className={state.ok ? "text-leaf" : "text-red-700"}>
            {state.message}
          </span>
        )}
      </div>
    </form>
  );
}
