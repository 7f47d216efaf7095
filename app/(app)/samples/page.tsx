import type { Metadata } from "next";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { canWrite } from "@/lib/auth/access";
import { listSamples } from "@/lib/queries/samples";
import { EmptyState } from "@/components/ui/EmptyState";
import { HazardNotice } from "@/components/ui/HazardNotice";
import { PageHeader } from "@/components/ui/PageHeader";

export const metadata: Metadata = { title: "Samples" };

export default async function SamplesPage({ searchParams }: { searchParams: Promise<{ q?: string }> }) {
  const actor = await requireActor("/samples");
  const q = ((await searchParams).q ?? "").slice(0, 100);
  const samples = await listSamples(actor, q);
  const mayRegister = actor.memberships.some((m) => canWrite(actor, m.groupId));
  return (
    <>
      <PageHeader
        title="Samples"
        subtitle="Batches of dots with their material, ligands, solvent and parent samples."
        actions={mayRegister && (
          <Link href="/samples/new" className="rounded-md bg-glow px-3 py-2 text-sm font-medium text-white hover:bg-glow-deep">Register a sample</Link>
        )}
      />
      <form className="mb-4" role="search">
        <input name="q" defaultValue={q} placeholder="Filter by name or material" aria-label="Filter samples"
          className="w-72 rounded-md border border-stone-300 px-3 py-1.5 text-sm" />
      </form>
      {samples.length === 0 ? (
        <EmptyState title={q ? "No sample matches that filter" : "No samples yet"} action={mayRegister ? { href: "/samples/new", label: "Register the first sample" } : undefined}>
          {q ? "Try a shorter filter." : "Register each batch once: its spectra, parents and derived size then hang together."}
        </EmptyState>
      ) : (
        <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm">
            <thead className="bg-stone-100 text-left text-xs text-ink-soft">
              <tr><th className="px-3 py-2">Name</th><th className="px-3 py-2">Material</th><th className="px-3 py-2">Parents</th><th className="px-3 py-2">Spectra</th><th className="px-3 py-2">Cautions</th></tr>
            </thead>
            <tbody>
              {samples.map((s) => (
                <tr key={s.id} className="border-t border-stone-100 hover:bg-stone-50">
                  <td className="px-3 py-2"><Link prefetch={false} className="font-medium text-glow-deep hover:underline" href={`/samples/${s.id}`}>{s.name}</Link><div className="text-xs text-ink-faint">{s.groupName}{s.projectName ? ` · ${s.projectName}` : ""}</div></td>
                  <td className="px-3 py-2">{s.material}{s.coreShell && <span className="text-ink-soft"> · {s.coreShell}</span>}</td>
                  <td className="px-3 py-2 text-ink-soft">{s.parentNames.join(", ") || "—"}</td>
                  <td className="tabular px-3 py-2">{s.spectrumCount}</td>
                  <td className="px-3 py-2"><HazardNotice flags={s.hazards} compact /></td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
