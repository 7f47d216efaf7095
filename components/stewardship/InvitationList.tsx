import { revokeInvitation } from "@/app/(app)/stewardship/actions";
import { RowActionButton } from "@/components/forms/ActionForm";
import { formatDay } from "@/lib/format/dates";
import { ROLE_LABELS } from "@/lib/navigation";
import type { InvitationRow } from "@/lib/stewardship/queries";

/** The invitations sent, with their state; an open one can be revoked. */
export function InvitationList({ invitations }: { invitations: InvitationRow[] }) {
  return (
    <>
      <h2 className="mb-2 text-base font-semibold">Invitations</h2>
      {invitations.length === 0 ? (
        <p className="text-sm text-ink-soft">No invitations yet.</p>
      ) : (
        <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm" data-testid="invitations">
          {invitations.map((i) => (
            <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2">
              <span>
                <span className="font-medium">{i.email}</span> · {ROLE_LABELS[i.role as keyof typeof ROLE_LABELS]} · {i.groupName}
                {i.share ? ` · ${i.share}` : ""} ·{" "}
                <span className="text-ink-soft">
                  {i.state}
                  {i.state === "open" ? ` until ${formatDay(i.expiresAt)}` : ""}
                </span>
              </span>
              {i.state === "open" && <RowActionButton action={revokeInvitation} id={i.id} submit="Revoke" />}
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
