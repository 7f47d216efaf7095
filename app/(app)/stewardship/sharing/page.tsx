import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { ROLE_LABELS } from "@/lib/navigation";
import { listInvitations, listMembers, listShares, managedGroups, shareTargetOptions } from "@/lib/stewardship/queries";
import { listShareLinks } from "@/lib/stewardship/shareLinks";
import { ActionForm } from "@/components/forms/ActionForm";
import { ShareLinkPanel } from "@/components/stewardship/ShareLinkPanel";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { formatDay } from "@/lib/format/dates";
import { inputClass } from "@/components/forms/Field";
import { PageHeader } from "@/components/ui/PageHeader";
import { changeRole, inviteMember, removeMember, revokeInvitation, revokeShare, shareWithCollaborator } from "../actions";
import { ISO_DAY_PATTERN } from "@/lib/format/dates";

export const metadata: Metadata = { title: "People & sharing · Data care" };

const ROLES = ["spectroscopist", "lead", "steward", "collaborator"] as const;

export default async function SharingPage() {
  const actor = await requireActor("/stewardship/sharing");
  const groups = managedGroups(actor);
  if (groups.length === 0) return <StewardOnly what="Sharing and members" />;
  const isSteward = stewardGroupIds(actor).length > 0;
  const [members, invitations, shares, targets, links] = await Promise.all([
    listMembers(actor),
    listInvitations(actor),
    isSteward ? listShares(actor) : [],
    shareTargetOptions(actor),
    isSteward ? listShareLinks(actor) : [],
  ]);
  return (
    <>
      <PageHeader
        title="People & sharing"
        subtitle="Members of your groups, invitations by e-mail, and read-only shares with collaborators outside the group. Changes take effect at once."
      />
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
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </select>
          </label>
          <label className="text-sm font-medium">
            Shared with a collaborator
            <select name="shareTarget" defaultValue="" className={`${inputClass} mt-1 w-64`}>
              <option value="">— (members read everything)</option>
              {targets.map((t) => (
                <option key={t.id} value={`${t.type}:${t.id}`}>
                  {t.type === "series" ? "Series" : "Project"}: {t.label}
                </option>
              ))}
            </select>
          </label>
        </ActionForm>
      </section>

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
                        {ROLES.map((r) => (
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

      {isSteward && (
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
                <option value="" disabled>
                  Choose a project or series…
                </option>
                {targets.map((t) => (
                  <option key={t.id} value={`${t.type}:${t.id}`}>
                    {t.type === "series" ? "Series" : "Project"}: {t.label}
                  </option>
                ))}
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
            <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
              <table className="w-full text-sm" data-testid="shares-table">
                <thead className="bg-stone-100 text-left text-xs text-ink-soft">
                  <tr>
                    <th className="px-3 py-2">What</th>
                    <th className="px-3 py-2">With</th>
                    <th className="px-3 py-2">Until</th>
                    <th className="px-3 py-2">State</th>
                    <th />
                  </tr>
                </thead>
                <tbody>
                  {shares.map((s) => (
                    <tr key={s.id} className="border-t border-stone-100">
                      <td className="px-3 py-1.5">
                        <span className="text-xs text-ink-soft">{s.targetType}</span> {s.targetLabel}
                      </td>
                      <td className="px-3 py-1.5">{s.grantee}</td>
                      <td className="px-3 py-1.5">{s.expiresAt ? formatDay(s.expiresAt) : "no end date"}</td>
                      <td className="px-3 py-1.5">{s.revokedAt ? "revoked" : s.live ? "in force" : "expired"}</td>
                      <td className="px-3 py-1.5 text-right">
                        {s.live && (
                          <ActionForm action={revokeShare} submit="Revoke" danger className="inline-flex flex-wrap items-center gap-2">
                            <input type="hidden" name="id" value={s.id} />
                          </ActionForm>
                        )}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </section>
      )}

      {isSteward && (
        <section className="mb-6" aria-labelledby="share-links-heading">
          <h2 id="share-links-heading" className="mb-1 text-base font-semibold">
            Links
          </h2>
          <p className="mb-2 text-sm text-ink-soft">
            A read-only link to one project or series, for someone without an account. Only its fingerprint is stored, so the link is shown
            once; revoking it or reaching its expiry stops it at the next request.
          </p>
          <ShareLinkPanel targets={targets} links={links} />
        </section>
      )}

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
              {i.state === "open" && (
                <ActionForm action={revokeInvitation} submit="Revoke" danger className="inline-flex flex-wrap items-center gap-2">
                  <input type="hidden" name="id" value={i.id} />
                </ActionForm>
              )}
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
