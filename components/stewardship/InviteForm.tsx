import { inviteMember } from "@/app/(app)/stewardship/actions";
import { ActionForm } from "@/components/forms/ActionForm";
import { inputClass } from "@/components/forms/Field";
import { ROLE_LABELS } from "@/lib/navigation";
import { MEMBER_ROLES, type ShareTargetOption } from "./memberRoles";
import { ShareTargetOptions } from "./ShareTargetOptions";

/** Invites someone to a group by e-mail, as a member or as a collaborator who reads one project or series. */
export function InviteForm({ groups, targets }: { groups: { groupId: string; groupName: string }[]; targets: ShareTargetOption[] }) {
  return (
    <>
      <section className="mb-6 rounded-lg border border-stone-200 bg-white p-4">
        <h2 className="text-base font-semibold">Invite someone</h2>
        <p className="text-sm text-ink-soft">
          They get an e-mail with a link that works once within 7 days. A collaborator sees only the project or series you choose,
          read-only.
        </p>
        <ActionForm
          action={inviteMember}
          submit="Send invitation"
          pendingLabel="Sending…"
          className="mt-3 flex flex-wrap items-end gap-3"
          label="Invite"
        >
          <label className="text-sm font-medium">
            Group
            <select name="groupId" className={`${inputClass} mt-1`}>
              {groups.map((g) => (
                <option key={g.groupId} value={g.groupId}>
                  {g.groupName}
                </option>
              ))}
            </select>
          </label>
          <label className="text-sm font-medium">
            E-mail
            <input name="email" type="email" required className={`${inputClass} mt-1 w-64`} />
          </label>
          <label className="text-sm font-medium">
            Role
            <select name="role" defaultValue="spectroscopist" className={`${inputClass} mt-1`}>
              {MEMBER_ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </select>
          </label>
          <label className="text-sm font-medium">
            Shared with a collaborator
            <select name="shareTarget" defaultValue="" className={`${inputClass} mt-1 w-64`}>
              <ShareTargetOptions targets={targets} none="— (members read everything)" />
            </select>
          </label>
        </ActionForm>
      </section>
    </>
  );
}
