import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { DATA_CLASS_LABELS, listOpenFlags } from "@/lib/stewardship/queries";
import { ActionForm } from "@/components/stewardship/ActionForm";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { formatDate } from "@/components/stewardship/format";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { decideFlag } from "./actions";

export const metadata: Metadata = { title: "Stewardship" };

export default async function StewardshipPage() {
  const actor = await requireActor("/stewardship");
  if (stewardGroupIds(actor).length === 0) return <StewardOnly what="Stewardship" />;
  const flags = await listOpenFlags(actor);
  return (
    <>
      <PageHeader title="Stewardship" subtitle="Items whose retention period ended under a “flag” policy wait here for your decision. Nothing is deleted until you choose." />
      {flags.length === 0 ? (
        <EmptyState title="Nothing to decide">When a policy set to “flag for me” expires something, it appears here.</EmptyState>
      ) : (
        <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm" data-testid="flags-table">
            <thead className="bg-stone-100 text-left text-xs uppercase tracking-wide text-ink-soft"><tr><th className="px-3 py-2">Item</th><th className="px-3 py-2">Project</th><th className="px-3 py-2">Class</th><th className="px-3 py-2">Flagged</th><th className="px-3 py-2">Decision</th></tr></thead>
            <tbody>
              {flags.map((f) => (
                <tr key={f.id} className="border-t border-stone-100">
                  <td className="px-3 py-1.5 font-medium">{f.label}</td><td className="px-3 py-1.5">{f.projectName}</td>
                  <td className="px-3 py-1.5">{DATA_CLASS_LABELS[f.dataClass]}</td><td className="px-3 py-1.5">{formatDate(f.flaggedAt)}</td>
                  <td className="flex gap-2 px-3 py-1.5">
                    <ActionForm action={decideFlag} submit="Keep" danger={false} className="flex flex-wrap items-center gap-2"><input type="hidden" name="id" value={f.id} /><input type="hidden" name="decision" value="keep" /></ActionForm>
                    <ActionForm action={decideFlag} submit="Delete" danger className="flex flex-wrap items-center gap-2"><input type="hidden" name="id" value={f.id} /><input type="hidden" name="decision" value="delete" /></ActionForm>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
