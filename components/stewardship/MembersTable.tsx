import { changeRole, removeMember } from "@/app/(app)/stewardship/actions";
import { ActionForm, RowActionButton } from "@/components/forms/ActionForm";
import { inputClass } from "@/components/forms/Field";
import { ROLE_LABELS } from "@/lib/navigation";
import type { MemberRow } from "@/lib/stewardship/queries";
import { MEMBER_ROLES } from "./memberRoles";
import { CardTable } from "@/components/ui/CardTable";

/** The members of the groups the reader manages, with their roles to change and a remove button (never on the reader's own row). */
export function MembersTable({ members }: { members: MemberRow[] }) {
  return (
    <>
      <h2 className="mb-2 text-base font-semibold">Members</h2>
      <CardTable headers={["Person", "Group", "Role", ""]} testId="members-table" className="mb-6">
        {members.map((m) => (
          <tr key={m.id} className="border-t border-stone-100">
            <td className="px-3 py-1.5">
              <span className="font-medium">{m.name}</span> <span className="text-xs text-ink-soft">{m.email}</span>
            </td>
            <td className="px-3 py-1.5">{m.groupName}</td>
            <td className="px-3 py-1.5">
              {m.isSelf ? (
                ROLE_LABELS[m.role as keyof typeof ROLE_LABELS]
              ) : (
                <ActionForm action={changeRole} submit="Change" className="flex flex-wrap items-center gap-2" label={`Role of ${m.email}`}>
                  <input type="hidden" name="id" value={m.id} />
                  <select name="role" defaultValue={m.role} aria-label={`Role of ${m.email}`} className={`${inputClass} w-52`}>
                    {MEMBER_ROLES.map((r) => (
                      <option key={r} value={r}>
                        {ROLE_LABELS[r]}
                      </option>
                    ))}
                  </select>
                </ActionForm>
              )}
            </td>
            <td className="px-3 py-1.5 text-right">{!m.isSelf && <RowActionButton action={removeMember} id={m.id} submit="Remove" />}</td>
          </tr>
        ))}
      </CardTable>
    </>
  );
}
