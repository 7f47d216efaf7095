"use client";

import { useActionState } from "react";
import { createApiToken, revokeApiToken } from "@/app/(app)/settings/actions";
import { initialActionState } from "@/lib/actions/protected-state";
import { inputClass } from "@/components/forms/Field";
import { formatDay, formatWhen } from "@/lib/format/dates";

type Token = {
  id: string;
  name: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  expiresAt: string | null;
};

function tokenState(t: Token): string {
  if (t.revokedAt) return "revoked";
  if (t.expiresAt && new Date(t.expiresAt).getTime() <= Date.now()) return `expired ${formatDay(t.expiresAt)}`;
  const used = t.lastUsedAt ? `last used ${formatWhen(t.lastUsedAt)}` : "never used";
  return t.expiresAt ? `${used}; expires ${formatDay(t.expiresAt)}` : used;
}

function RevokeButton({ id }: { id: string }) {
  const [, action, pending] = useActionState(revokeApiToken, initialActionState);
  return (
    <form action={action}>
      <input type="hidden" name="id" value={id} />
      <button disabled={pending} className="text-xs text-red-700 hover:underline disabled:opacity-50">
        {pending ? "Revoking…" : "Revoke"}
      </button>
    </form>
  );
}

export function ApiTokenPanel({ tokens }: { tokens: Token[] }) {
  const [state, action, pending] = useActionState(createApiToken, initialActionState);
  return (
    <div className="space-y-3">
      <form action={action} className="flex items-start gap-2">
        <div>
          <input
            name="name"
            placeholder="e.g. titration-robot"
            aria-label="Token name"
            aria-invalid={!!state.fieldErrors?.name}
            className={`${inputClass} w-64`}
          />
          {state.fieldErrors?.name && (
            <p role="alert" className="mt-1 text-sm text-red-700">
              {state.fieldErrors.name.join(" ")}
            </p>
          )}
        </div>
        <label className="flex items-center gap-1 text-sm">
          <span className="text-ink-soft">Expires</span>
          <select name="lifetime" defaultValue="90" aria-label="Token lifetime" className={`${inputClass} w-32`}>
            <option value="30">in 30 days</option>
            <option value="90">in 90 days</option>
            <option value="365">in a year</option>
            <option value="never">never</option>
          </select>
        </label>
        <button
          disabled={pending}
          className="rounded-md bg-glow px-3 py-1.5 text-sm font-medium text-white hover:bg-glow-deep disabled:opacity-60"
        >
          Create token
        </button>
      </form>
      {state.ok && state.message && (
        <div role="status" className="rounded-md border border-leaf/40 bg-leaf-soft px-3 py-2 text-sm">
          <p className="font-medium">Copy this token now: it is shown only once.</p>
          <code data-testid="new-token" className="mt-1 block break-all font-mono text-xs">
            {state.message}
          </code>
          <p className="mt-1 text-xs text-ink-soft">
            Send it as <code>Authorization: Bearer …</code> (see the API section of the README).
          </p>
        </div>
      )}
      {tokens.length === 0 ? (
        <p className="text-sm text-ink-soft">No tokens yet.</p>
      ) : (
        <ul className="divide-y divide-stone-100 rounded-md border border-stone-200">
          {tokens.map((t) => (
            <li key={t.id} className="flex items-center justify-between px-3 py-2 text-sm">
              <span>
                <span className="font-medium">{t.name}</span> <code className="text-xs text-ink-soft">{t.prefix}…</code>
                <span className="ml-2 text-xs text-ink-faint">{tokenState(t)}</span>
              </span>
              {!t.revokedAt && <RevokeButton id={t.id} />}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
