"use client";

import { useActionState } from "react";
import { unlockAccountAction } from "@/app/signin/unlock/actions";
import { initialActionState } from "@/lib/actions/protected-state";

export function UnlockForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState(unlockAccountAction, initialActionState);
  if (state.ok) {
    return (
      <p role="status" className="rounded-md bg-emerald-50 px-3 py-2 text-sm text-emerald-900">
        {state.message}{" "}
        <a href="/signin" className="underline">
          Sign in
        </a>
      </p>
    );
  }
  return (
    <form action={action} className="space-y-3" aria-label="Unlock account">
      <input type="hidden" name="token" value={token} />
      {state.message && (
        <p role="alert" className="text-sm text-red-700">
          {state.message}
        </p>
      )}
      <button
        disabled={pending}
        className="w-full rounded-md bg-glow px-3 py-2 text-sm font-medium text-white hover:bg-glow-deep disabled:opacity-60"
      >
        {pending ? "Unlocking…" : "Unlock my account"}
      </button>
    </form>
  );
}
