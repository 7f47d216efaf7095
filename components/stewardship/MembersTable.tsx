import { changeRole, removeMember } from "@/app/(app)/stewardship/actions";
import { ActionForm } from "@/components/forms/ActionForm";
import { inputClass } from "@/components/forms/Field";
import { ROLE_LABELS } from "@/lib/navigation";
import type { MemberRow } from "@/lib/stewardship/queries";
import { MEMBER_ROLES } from "./memberRoles";

/** The members of the groups the reader manages, with their roles to change and a remove button (never on the reader's own row). */
export function MembersTable({ members }: { members: MemberRow[] }) {
  return (
    <>
      <h2 className="mb-2 text-base font-semibold">Members</h2>
      <div className="mb-6 overflow-hidden rounded-lg border border-stone-200 bg-white">
        <table className="w-full text-sm" data-testid="members-table">
          <thead className="bg-stone-100 text-left text-xs text-ink-soft">
            <tr>
              <th className="px-3 py-2">Person</th>
              <th className="px-3 py-2">Group</th>
              <th className="px-3 py-2">Role</th>
              <th />
            </tr>
          </thead>
          <tbody>
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
                    <ActionForm
                      action={changeRole}
                      submit="Change"
                      className="flex flex-wrap items-center gap-2"
                      label={`Role of ${m.email}`}
                    >
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
                <td className="px-3 py-1.5 text-right">
                  {!m.isSelf && (
                    <ActionForm action={removeMember} submit="Remove" danger className="inline-flex flex-wrap items-center gap-2">
                      <input type="hidden" name="id" value={m.id} />
                    </ActionForm>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
