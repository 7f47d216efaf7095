import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { DATA_CLASS_LABELS, storageOverview } from "@/lib/stewardship/queries";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { formatBytes } from "@/lib/format/bytes";
import { formatDay } from "@/lib/format/dates";
import { PageHeader } from "@/components/ui/PageHeader";

export const metadata: Metadata = { title: "Space used · Data care" };

export default async function StoragePage() {
  const actor = await requireActor("/stewardship/storage");
  if (stewardGroupIds(actor).length === 0) return <StewardOnly what="Storage" />;
  const rows = await storageOverview(actor);
  const total = rows.reduce((s, r) => s + r.bytes, 0);
  return (
    <>
      <PageHeader
        title="Space used"
        subtitle={
          <>
            Use by project and data class ({formatBytes(total)} in all), and what the policies in force will free — counting today&apos;s
            holds and dependencies.
          </>
        }
      />
      <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
        <table className="w-full text-sm" data-testid="storage-table">
          <thead className="bg-stone-100 text-left text-xs text-ink-soft">
            <tr>
              <th className="px-3 py-2">Project</th>
              <th className="px-3 py-2">Class</th>
              <th className="px-3 py-2 text-right">Items</th>
              <th className="px-3 py-2 text-right">Size</th>
              <th className="px-3 py-2">Policy</th>
              <th className="px-3 py-2 text-right">Freed at next sweep</th>
              <th className="px-3 py-2 text-right">within 30 days</th>
              <th className="px-3 py-2 text-right">within a year</th>
              <th className="px-3 py-2">Next expiry</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={`${r.projectId}-${r.dataClass}`} className="border-t border-stone-100">
                <td className="px-3 py-1.5 font-medium">{r.projectName}</td>
                <td className="px-3 py-1.5">{DATA_CLASS_LABELS[r.dataClass]}</td>
                <td className="tabular px-3 py-1.5 text-right">{r.items}</td>
                <td className="tabular px-3 py-1.5 text-right">{formatBytes(r.bytes)}</td>
                <td className="px-3 py-1.5 text-ink-soft">{r.policy ?? "kept indefinitely"}</td>
                <td className="tabular px-3 py-1.5 text-right">{formatBytes(r.freeNow)}</td>
                <td className="tabular px-3 py-1.5 text-right">{formatBytes(r.free30)}</td>
                <td className="tabular px-3 py-1.5 text-right">{formatBytes(r.free365)}</td>
                <td className="px-3 py-1.5">{formatDay(r.nextExpiry)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-ink-faint">
        Processed data is counted as the size of the stored analysis reports. “Flag” policies free nothing by themselves.
      </p>
    </>
  );
}
