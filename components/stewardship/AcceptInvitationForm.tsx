"use client";

import { useActionState } from "react";
import { acceptInvitationAction } from "@/app/invite/actions";
import { initialActionState } from "@/lib/actions/protected-state";
import { Field, inputClass } from "@/components/forms/Field";

export function AcceptInvitationForm({ token, needsAccount }: { token: string; needsAccount: boolean }) {
  const [state, action, pending] = useActionState(acceptInvitationAction, initialActionState);
  return (
    <form action={action} className="space-y-3" aria-label="Accept invitation">
      <input type="hidden" name="token" value={token} />
      {needsAccount && (
        <>
          <Field name="name" label="Your name" errors={state.fieldErrors?.name}>
            <input
              id="name"
              name="name"
              defaultValue={state.values?.name}
              aria-invalid={!!state.fieldErrors?.name}
              className={inputClass}
              autoComplete="name"
            />
          </Field>
          <Field name="password" label="Choose a password" hint="At least 10 characters." errors={state.fieldErrors?.password}>
            <input
              id="password"
              name="password"
              type="password"
              aria-invalid={!!state.fieldErrors?.password}
              className={inputClass}
              autoComplete="new-password"
            />
          </Field>
        </>
      )}
      {state.message && !state.fieldErrors && (
        <p role="alert" className="text-sm text-red-700">
          {state.message}
        </p>
      )}
      <button
        disabled={pending}
        className="w-full rounded-md bg-glow px-3 py-2 text-sm font-medium text-white hover:bg-glow-deep disabled:opacity-60"
      >
        {pending ? "Accepting…" : needsAccount ? "Create account and accept" : "Accept invitation"}
      </button>
    </form>
  );
}
