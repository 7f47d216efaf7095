import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { DATA_CLASS_LABELS, storageOverview } from "@/lib/stewardship/queries";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { formatBytes } from "@/lib/format/bytes";
import { formatDay } from "@/lib/format/dates";
import { PageHeader } from "@/components/ui/PageHeader";
import { CardTable } from "@/components/ui/CardTable";

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
      <CardTable
        headers={[
          "Project",
          "Class",
          { label: "Items", right: true },
          { label: "Size", right: true },
          "Policy",
          { label: "Freed at next sweep", right: true },
          { label: "within 30 days", right: true },
          { label: "within a year", right: true },
          "Next expiry",
        ]}
        testId="storage-table"
      >
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
      </CardTable>
      <p className="mt-2 text-xs text-ink-faint">
        Processed data is counted as the size of the stored analysis reports. “Flag” policies free nothing by themselves.
      </p>
    </>
  );
}
