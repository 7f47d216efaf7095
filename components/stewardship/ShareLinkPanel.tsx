"use client";

import { useActionState, useRef, useState } from "react";
import { shareLinkAction } from "@/app/(app)/stewardship/actions";
import { initialActionState } from "@/lib/actions/protected-state";
import { inputClass } from "@/components/forms/Field";
import { ActionForm } from "@/components/forms/ActionForm";
import { formatWhen } from "@/lib/format/dates";
import type { ShareTargetOption as Target } from "./memberRoles";
import { CardTable } from "@/components/ui/CardTable";
import { ShareTargetOptions } from "./ShareTargetOptions";

type LinkRow = {
  id: string;
  prefix: string;
  targetType: "project" | "series";
  targetLabel: string;
  createdAt: string;
  createdBy: string;
  expiresAt: string | null;
  revokedAt: string | null;
  state: "in force" | "revoked" | "expired";
};

/** UTC, the same on the server and in the browser (and the zone the expiry is entered in). */

const STATE_CLASS: Record<LinkRow["state"], string> = {
  "in force": "bg-leaf-soft text-leaf",
  revoked: "bg-stone-200 text-ink-soft",
  expired: "bg-caution-soft text-caution",
};

function NewLink({ path }: { path: string }) {
  const [copied, setCopied] = useState<"" | "copied" | "failed">("");
  const input = useRef<HTMLInputElement>(null);
  const full = typeof window === "undefined" ? path : `${window.location.origin}${path}`;
  return (
    <div role="status" className="rounded-md border border-leaf/40 bg-leaf-soft px-3 py-2 text-sm" data-testid="new-share-link">
      <p className="font-medium">
        Copy this link now: it is shown only once. Anyone who has it can read what it names until it expires or you revoke it.
      </p>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <input
          ref={input}
          readOnly
          value={full}
          aria-label="New share link"
          data-testid="new-share-link-url"
          onFocus={(e) => e.currentTarget.select()}
          className={`${inputClass} min-w-0 flex-1 font-mono text-xs`}
        />
        <button
          type="button"
          className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-50"
          onClick={async () => {
            try {
              await navigator.clipboard.writeText(full);
              setCopied("copied");
            } catch {
              input.current?.select();
              setCopied("failed");
            }
          }}
        >
          Copy link
        </button>
        {copied && (
          <span className="text-xs text-ink-soft">{copied === "copied" ? "Copied." : "Selected: press Ctrl+C (⌘C) to copy."}</span>
        )}
      </div>
    </div>
  );
}

export function ShareLinkPanel({ targets, links }: { targets: Target[]; links: LinkRow[] }) {
  const [state, action, pending] = useActionState(shareLinkAction, initialActionState);
  const errors = state.fieldErrors ?? {};
  return (
    <div className="space-y-3">
      <form
        action={action}
        aria-label="New share link"
        className="flex flex-wrap items-end gap-3 rounded-lg border border-stone-200 bg-white p-4"
      >
        <input type="hidden" name="intent" value="create" />
        <label className="text-sm font-medium">
          What
          <select
            name="shareTarget"
            required
            defaultValue={state.values?.shareTarget ?? ""}
            aria-invalid={!!errors.shareTarget}
            className={`${inputClass} mt-1 w-72`}
          >
            <ShareTargetOptions targets={targets} />
          </select>
        </label>
        <label className="text-sm font-medium">
          Expires (UTC, optional)
          <input
            name="expiresAt"
            type="datetime-local"
            defaultValue={state.values?.expiresAt ?? ""}
            aria-invalid={!!errors.expiresAt}
            className={`${inputClass} mt-1`}
          />
        </label>
        <button
          disabled={pending}
          className="rounded-md bg-glow px-3 py-1.5 text-sm font-medium text-white hover:bg-glow-deep disabled:opacity-60"
        >
          {pending ? "Creating…" : "Create link"}
        </button>
        {!state.ok && state.message && (
          <p role="alert" className="basis-full text-sm text-red-700">
            {Object.values(errors).flat().join(" ") || state.message}
          </p>
        )}
      </form>
      {state.ok && state.message?.startsWith("/shared/") && <NewLink path={state.message} />}
      {links.length === 0 ? (
        <p className="text-sm text-ink-soft">No share links yet.</p>
      ) : (
        <CardTable headers={["Link", "What", "Created", "Expires", "State", ""]} testId="share-links-table">
          {links.map((l) => (
            <tr key={l.id} className="border-t border-stone-100" data-testid="share-link-row">
              <td className="whitespace-nowrap px-3 py-1.5">
                <code className="text-xs text-ink-soft">/shared/{l.prefix || "?"}…</code>
              </td>
              <td className="px-3 py-1.5">
                <span className="text-xs text-ink-soft">{l.targetType}</span> {l.targetLabel}
              </td>
              <td className="px-3 py-1.5">
                {formatWhen(l.createdAt)}
                {l.createdBy && <span className="block text-xs text-ink-soft">{l.createdBy}</span>}
              </td>
              <td className="px-3 py-1.5">{l.expiresAt ? formatWhen(l.expiresAt) : "until revoked"}</td>
              <td className="whitespace-nowrap px-3 py-1.5">
                <span className={`rounded-full px-2 py-0.5 text-xs font-medium ${STATE_CLASS[l.state]}`}>{l.state}</span>
              </td>
              <td className="px-3 py-1.5 text-right">
                {l.state === "in force" && (
                  <ActionForm
                    action={shareLinkAction}
                    submit="Revoke"
                    pendingLabel="Revoking…"
                    danger
                    className="inline-flex flex-wrap items-center justify-end gap-2"
                    label={`Revoke link ${l.prefix}`}
                  >
                    <input type="hidden" name="intent" value="revoke" />
                    <input type="hidden" name="id" value={l.id} />
                  </ActionForm>
                )}
              </td>
            </tr>
          ))}
        </CardTable>
      )}
    </div>
  );
}
