import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { listAuditEvents } from "@/lib/queries/audit";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";

export const metadata: Metadata = { title: "Stewardship" };

export default async function StewardshipPage({ searchParams }: { searchParams: Promise<{ action?: string }> }) {
  const actor = await requireActor("/stewardship");
  if (!actor.memberships.some((m) => m.role === "steward")) {
    return <EmptyState title="Stewardship is for data stewards">Retention, legal holds, sharing and the audit trail are managed by your group&apos;s data steward.</EmptyState>;
  }
  const action = ((await searchParams).action ?? "").slice(0, 60) || undefined;
  const events = await listAuditEvents(actor, { action });
  return (
    <>
      <PageHeader title="Stewardship" subtitle="The audit trail of your groups: who did what, and when. It cannot be edited or deleted." />
      <form className="mb-4 flex gap-2" role="search">
        <input name="action" defaultValue={action} placeholder="Filter by action, e.g. sign-in" aria-label="Filter by action" className="w-72 rounded-md border border-stone-300 px-3 py-1.5 text-sm" />
        <button className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm">Apply</button>
      </form>
      {events.length === 0 ? (
        <EmptyState title="No events match">Uploads, analyses, decisions and sign-ins are recorded here as they happen.</EmptyState>
      ) : (
        <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm" data-testid="audit-table">
            <thead className="bg-stone-100 text-left text-xs uppercase tracking-wide text-ink-soft"><tr><th className="px-3 py-2">When</th><th className="px-3 py-2">Who</th><th className="px-3 py-2">Action</th><th className="px-3 py-2">Target</th><th className="px-3 py-2">Details</th></tr></thead>
            <tbody>
              {events.map((e) => (
                <tr key={e.id} className="border-t border-stone-100">
                  <td className="tabular whitespace-nowrap px-3 py-1.5 text-ink-soft">{new Date(e.at).toLocaleString("en-GB")}</td>
                  <td className="px-3 py-1.5">{e.actor}</td><td className="px-3 py-1.5 font-medium">{e.action}</td>
                  <td className="max-w-[12rem] truncate px-3 py-1.5 font-mono text-xs">{e.target}</td>
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
