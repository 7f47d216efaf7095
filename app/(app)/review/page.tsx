import type { Metadata } from "next";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { listAwaitingSignatures } from "@/lib/queries/review";
import { KIND_LABELS } from "@/lib/signature-labels";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";

export const metadata: Metadata = { title: "Review" };

export default async function ReviewPage() {
  const actor = await requireActor("/review");
  if (!actor.memberships.some((m) => m.role === "lead")) {
    return <EmptyState title="Review is for group leads">Signatures are confirmed or dismissed by a lead of the group that owns the spectrum.</EmptyState>;
  }
  const items = await listAwaitingSignatures(actor);
  return (
    <>
      <PageHeader title="Review" subtitle="Band changes flagged by the analysis, waiting for a lead's decision. Most significant first." />
      {items.length === 0 ? (
        <EmptyState title="Nothing waits for review">New flags appear here as soon as the analysis of an upload finishes.</EmptyState>
      ) : (
        <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm" data-testid="review-queue">
            <thead className="bg-stone-100 text-left text-xs uppercase tracking-wide text-ink-soft"><tr><th className="px-3 py-2">Change</th><th className="px-3 py-2">Significance</th><th className="px-3 py-2">Magnitude</th><th className="px-3 py-2">Spectrum</th><th className="px-3 py-2">Sample</th><th className="px-3 py-2">Project</th></tr></thead>
            <tbody className="tabular">
              {items.map((i) => (
                <tr key={i.id} className="border-t border-stone-100 hover:bg-stone-50">
                  <td className="px-3 py-1.5 font-medium">{KIND_LABELS[i.kind] ?? i.kind}</td>
                  <td className="px-3 py-1.5">{i.significance.toFixed(1)}σ</td>
                  <td className="px-3 py-1.5">{i.fraction !== null ? `${(i.fraction * 100).toFixed(1)} %` : i.shiftMeV !== null ? `${i.shiftMeV.toFixed(1)} meV` : i.energyEv !== null ? `at ${i.energyEv.toFixed(3)} eV` : "—"}</td>
                  <td className="max-w-xs truncate px-3 py-1.5"><Link className="text-glow-deep hover:underline" href={`/spectra/${i.spectrumId}`}>{i.fileName}</Link></td>
                  <td className="px-3 py-1.5">{i.sampleName ?? "—"}</td><td className="px-3 py-1.5 text-ink-soft">{i.projectName}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
