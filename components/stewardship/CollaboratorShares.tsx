import { revokeShare, shareWithCollaborator } from "@/app/(app)/stewardship/actions";
import { ActionForm, RowActionButton } from "@/components/forms/ActionForm";
import { inputClass } from "@/components/forms/Field";
import { formatDay, ISO_DAY_PATTERN } from "@/lib/format/dates";
import type { ShareRow } from "@/lib/stewardship/queries";
import type { ShareTargetOption } from "./memberRoles";
import { CardTable } from "@/components/ui/CardTable";
import { ShareTargetOptions } from "./ShareTargetOptions";

/** Read-only shares with named collaborators: the form to share a project or series and the shares given, each revocable. */
export function CollaboratorShares({ shares, targets }: { shares: ShareRow[]; targets: ShareTargetOption[] }) {
  return (
    <>
      <section className="mb-6">
        <h2 className="mb-2 text-base font-semibold">Shares with collaborators</h2>
        <ActionForm
          action={shareWithCollaborator}
          submit="Share read-only"
          pendingLabel="Sharing…"
          className="mb-3 flex flex-wrap items-end gap-3 rounded-lg border border-stone-200 bg-white p-4"
          label="Share"
        >
          <label className="text-sm font-medium">
            Collaborator&apos;s e-mail
            <input name="email" type="email" required className={`${inputClass} mt-1 w-64`} />
          </label>
          <label className="text-sm font-medium">
            What
            <select name="shareTarget" required defaultValue="" className={`${inputClass} mt-1 w-72`}>
              <ShareTargetOptions targets={targets} />
            </select>
          </label>
          <label className="text-sm font-medium">
            Until (optional)
            <input
              name="expiresOn"
              type="text"
              inputMode="numeric"
              placeholder="YYYY-MM-DD"
              pattern={ISO_DAY_PATTERN}
              title="A date as YYYY-MM-DD"
              className={`${inputClass} mt-1`}
            />
          </label>
        </ActionForm>
        {shares.length === 0 ? (
          <p className="text-sm text-ink-soft">Nothing is shared outside the group.</p>
        ) : (
          <CardTable headers={["What", "With", "Until", "State", ""]} testId="shares-table">
            {shares.map((s) => (
              <tr key={s.id} className="border-t border-stone-100">
                <td className="px-3 py-1.5">
                  <span className="text-xs text-ink-soft">{s.targetType}</span> {s.targetLabel}
                </td>
                <td className="px-3 py-1.5">{s.grantee}</td>
                <td className="px-3 py-1.5">{s.expiresAt ? formatDay(s.expiresAt) : "no end date"}</td>
                <td className="px-3 py-1.5">{s.revokedAt ? "revoked" : s.live ? "in force" : "expired"}</td>
                <td className="px-3 py-1.5 text-right">{s.live && <RowActionButton action={revokeShare} id={s.id} submit="Revoke" />}</td>
              </tr>
            ))}
          </CardTable>
        )}
      </section>
    </>
  );
}
