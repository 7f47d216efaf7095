import type { Metadata } from "next";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { writesSomewhere } from "@/lib/auth/access";
import { z } from "zod";
import { listSamples } from "@/lib/queries/samples";
import { queryObject } from "@/lib/review/schemas";
import { countText } from "@/lib/search/fastCount";
import { decodeCursor } from "@/lib/search/keysetCursor";
import { EmptyState } from "@/components/ui/EmptyState";
import { HazardNotice } from "@/components/ui/HazardNotice";
import { PageHeader } from "@/components/ui/PageHeader";

export const metadata: Metadata = { title: "Samples" };

const samplesQuerySchema = z.object({
  q: z.string().trim().max(100).catch(""),
  after: z
    .string()
    .max(200)
    .refine((c) => decodeCursor(c) !== null)
    .optional()
    .catch(undefined),
});

export default async function SamplesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await requireActor("/samples");
  const { q, after } = samplesQuerySchema.parse(queryObject(await searchParams));
  const page = await listSamples(actor, { q, after });
  const samples = page.rows;
  const href = (changes: { after?: string }) => {
    const params = new URLSearchParams();
    if (q) params.set("q", q);
    if (changes.after) params.set("after", changes.after);
    const qs = params.toString();
    return qs ? `/samples?${qs}` : "/samples";
  };
  const mayRegister = writesSomewhere(actor);
  return (
    <>
      <PageHeader
        title="Samples"
        subtitle="Batches of dots with their material, ligands, solvent and parent samples."
        actions={
          mayRegister && (
            <Link href="/samples/new" className="rounded-md bg-glow px-3 py-2 text-sm font-medium text-white hover:bg-glow-deep">
              Register a sample
            </Link>
          )
        }
      />
      <form className="mb-4" role="search">
        <input
          name="q"
          defaultValue={q}
          placeholder="Filter by name or material"
          aria-label="Filter samples"
          className="w-72 rounded-md border border-stone-300 px-3 py-1.5 text-sm"
        />
      </form>
      {samples.length === 0 ? (
        <EmptyState
          title={q ? "No sample matches that filter" : "No samples yet"}
          action={mayRegister ? { href: "/samples/new", label: "Register the first sample" } : undefined}
        >
          {q ? "Try a shorter filter." : "Register each batch once: its spectra, parents and derived size then hang together."}
        </EmptyState>
      ) : (
        <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm">
            <thead className="bg-stone-100 text-left text-xs text-ink-soft">
              <tr>
                <th className="px-3 py-2">Name</th>
                <th className="px-3 py-2">Material</th>
                <th className="px-3 py-2">Parents</th>
                <th className="px-3 py-2">Spectra</th>
                <th className="px-3 py-2">Cautions</th>
              </tr>
            </thead>
            <tbody>
              {samples.map((s) => (
                <tr key={s.id} className="border-t border-stone-100 hover:bg-stone-50">
                  <td className="px-3 py-2">
                    <Link prefetch={false} className="font-medium text-glow-deep hover:underline" href={`/samples/${s.id}`}>
                      {s.name}
                    </Link>
                    <div className="text-xs text-ink-faint">
                      {s.groupName}
                      {s.projectName ? ` · ${s.projectName}` : ""}
                    </div>
                  </td>
                  <td className="px-3 py-2">
                    {s.material}
                    {s.coreShell && <span className="text-ink-soft"> · {s.coreShell}</span>}
                  </td>
                  <td className="px-3 py-2 text-ink-soft">{s.parentNames.join(", ") || "—"}</td>
                  <td className="tabular px-3 py-2">{s.spectrumCount}</td>
                  <td className="px-3 py-2">
                    <HazardNotice flags={s.hazards} compact />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <nav aria-label="Pages of samples" className="flex items-center gap-3 border-t border-stone-100 px-3 py-2 text-sm text-ink-soft">
            <span>
              {samples.length} shown of {countText(page.count)}
            </span>
            {after && (
              <Link className="text-glow-deep hover:underline" href={href({})}>
                ← Newest
              </Link>
            )}
            {page.next && (
              <Link className="text-glow-deep hover:underline" href={href({ after: page.next })}>
                Older →
              </Link>
            )}
          </nav>
        </div>
      )}
    </>
  );
}
