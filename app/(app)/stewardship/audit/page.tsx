import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { auditActions, auditFilterSchema, listAuditEvents } from "@/lib/queries/audit";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { formatWhen } from "@/lib/format/dates";
import { inputClass } from "@/components/forms/Field";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { ISO_DAY_PATTERN } from "@/lib/format/dates";

export const metadata: Metadata = { title: "Audit trail · Data care" };

export default async function AuditPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const actor = await requireActor("/stewardship/audit");
  if (stewardGroupIds(actor).length === 0) return <StewardOnly what="The audit trail" />;
  const raw = await searchParams;
  const picked = { action: raw.action ?? "", actor: raw.actor ?? "", target: raw.target ?? "", from: raw.from ?? "", to: raw.to ?? "" };
  const parsed = auditFilterSchema.safeParse(picked);
  const errors = parsed.success ? [] : parsed.error.issues.map((i) => i.message);
  const [events, actions] = await Promise.all([parsed.success ? listAuditEvents(actor, { ...parsed.data, limit: 500 }) : [], auditActions(actor)]);
  const query = new URLSearchParams(Object.entries(picked).filter(([, v]) => v)).toString();
  return (
    <>
      <PageHeader title="Audit trail" subtitle="Who did what, and when, in your groups. It cannot be edited or deleted." actions={
        parsed.success ? <a href={`/api/v1/audit?${query}${query ? "&" : ""}format=csv`} className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm font-medium hover:bg-stone-50" data-testid="audit-csv">Export CSV</a> : null
      } />
      <form className="mb-4 flex flex-wrap items-end gap-2" role="search" aria-label="Filter the audit trail">
        <label className="text-sm font-medium">Action
          <input name="action" list="audit-actions" defaultValue={picked.action} placeholder="e.g. sign-in" className={`${inputClass} mt-1 w-44`} />
          <datalist id="audit-actions">{actions.map((a) => <option key={a} value={a} />)}</datalist>
        </label>
        <label className="text-sm font-medium">Who<input name="actor" defaultValue={picked.actor} placeholder="e-mail contains…" className={`${inputClass} mt-1 w-48`} /></label>
        <label className="text-sm font-medium">Target<input name="target" defaultValue={picked.target} placeholder="type or id" className={`${inputClass} mt-1 w-48`} /></label>
        <label className="text-sm font-medium">From<input name="from" type="text" inputMode="numeric" placeholder="YYYY-MM-DD" pattern={ISO_DAY_PATTERN} title="A date as YYYY-MM-DD" defaultValue={picked.from} className={`${inputClass} mt-1`} /></label>
        <label className="text-sm font-medium">To<input name="to" type="text" inputMode="numeric" placeholder="YYYY-MM-DD" pattern={ISO_DAY_PATTERN} title="A date as YYYY-MM-DD" defaultValue={picked.to} className={`${inputClass} mt-1`} /></label>
        <button className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm">Apply</button>
      </form>
      {errors.length > 0 && <p role="alert" className="mb-3 text-sm text-red-700">{errors.join(" ")}</p>}
      {events.length === 0 ? (
        <EmptyState title="No events match">Sign-ins, uploads, analyses, decisions, shares, holds, policy changes and deletions are recorded here as they happen.</EmptyState>
      ) : (
        <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm" data-testid="audit-table">
            <thead className="bg-stone-100 text-left text-xs text-ink-soft"><tr><th className="px-3 py-2">When</th><th className="px-3 py-2">Who</th><th className="px-3 py-2">Action</th><th className="px-3 py-2">Target</th><th className="px-3 py-2">Details</th></tr></thead>
            <tbody>
              {events.map((e) => (
                <tr key={e.id} className="border-t border-stone-100">
                  <td className="tabular whitespace-nowrap px-3 py-1.5 text-ink-soft">{formatWhen(e.at)}</td>
                  <td className="px-3 py-1.5">{e.actor}</td><td className="px-3 py-1.5 font-medium">{e.action}</td>
                  <td className="max-w-[12rem] truncate px-3 py-1.5 font-mono text-xs" title={e.target}>{e.target}</td>
                  <td className="max-w-xs truncate px-3 py-1.5 font-mono text-xs text-ink-soft" title={e.details}>{e.details}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
