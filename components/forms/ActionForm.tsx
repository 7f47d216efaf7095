"use client";

import { startTransition, useActionState, useEffect, useRef, type ReactNode } from "react";
import { initialActionState, type ActionState } from "@/lib/actions/protected-state";

type ServerAction = (state: ActionState, formData: FormData) => Promise<ActionState>;

/**
 * A form bound to a protected server action: shows the outcome as a status line and the
 * field errors (each names its field) as an alert. Submitting twice is prevented while pending.
 * A refused form keeps what was typed (React resets a form after an action prop runs, so the
 * action is dispatched from onSubmit instead); a successful one is cleared.
 */
export function ActionForm({
  action,
  children,
  submit,
  pendingLabel,
  className = "",
  danger = false,
  label,
}: {
  action: ServerAction;
  children?: ReactNode;
  submit: string;
  pendingLabel?: string;
  className?: string;
  danger?: boolean;
  label?: string;
}) {
  const [state, formAction, pending] = useActionState(action, initialActionState);
  const errors = Object.values(state.fieldErrors ?? {}).flat();
  const ref = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (state.ok) ref.current?.reset();
  }, [state]);
  return (
    <form
      ref={ref}
      action={formAction}
      className={className}
      aria-label={label}
      onSubmit={(event) => {
        event.preventDefault();
        const data = new FormData(event.currentTarget);
        startTransition(() => formAction(data));
      }}
    >
      {children}
      <button
        disabled={pending}
        className={
          danger
            ? "rounded-md border border-red-300 bg-white px-2.5 py-1 text-xs font-medium text-red-700 hover:bg-red-50 disabled:opacity-50"
            : "rounded-md bg-glow px-3 py-1.5 text-sm font-medium text-white hover:bg-glow-deep disabled:opacity-60"
        }
      >
        {pending ? (pendingLabel ?? "Working…") : submit}
      </button>
      {state.message &&
        (state.ok ? (
          <p role="status" className="basis-full text-sm text-leaf">
            {state.message}
          </p>
        ) : (
          <p role="alert" className="basis-full text-sm text-red-700">
            {errors.length ? errors.join(" ") : state.message}
          </p>
        ))}
    </form>
  );
}

/** A one-button form that sends a row's id to a server action (remove, revoke, lift), shown in red. */
export function RowActionButton({ action, id, submit }: { action: ServerAction; id: string; submit: string }) {
  return (
    <ActionForm action={action} submit={submit} danger className="inline-flex flex-wrap items-center gap-2">
      <input type="hidden" name="id" value={id} />
    </ActionForm>
  );
}
