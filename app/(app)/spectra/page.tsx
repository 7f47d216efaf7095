import type { Metadata } from "next";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { listSpectra } from "@/lib/queries/spectra";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { formatWhen } from "@/lib/format/dates";

export const metadata: Metadata = { title: "Spectra" };

const TECHNIQUE_LABELS: Record<string, string> = { absorption: "Absorption", pl: "PL emission", ir: "Mid-IR" };

export default async function SpectraPage({ searchParams }: { searchParams: Promise<{ q?: string; status?: string; page?: string }> }) {
  const actor = await requireActor("/spectra");
  const sp = await searchParams;
  const q = (sp.q ?? "").slice(0, 100);
  const status = ["queued", "analysing", "analysed", "failed"].includes(sp.status ?? "") ? sp.status : undefined;
  const { rows, total, page, pages } = await listSpectra(actor, { q, status, page: Number(sp.page) || 1 });
  const link = (p: number) => `/spectra?${new URLSearchParams({ ...(q ? { q } : {}), ...(status ? { status } : {}), page: String(p) })}`;
  return (
    <>
      <PageHeader title="Spectra" subtitle={`${total} stored`} />
      <form className="mb-4 flex gap-2" role="search">
        <input name="q" defaultValue={q} placeholder="Filter by file name" aria-label="Filter spectra" className="w-72 rounded-md border border-stone-300 px-3 py-1.5 text-sm" />
        <select name="status" defaultValue={status ?? ""} aria-label="Status" className="rounded-md border border-stone-300 px-2 py-1.5 text-sm">
          <option value="">Any state</option><option value="queued">Waiting</option><option value="analysing">Analysing</option><option value="analysed">Analysed</option><option value="failed">Could not read</option>
        </select>
        <button className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm">Apply</button>
      </form>
      {rows.length === 0 ? (
        <EmptyState title={q || status ? "No spectrum matches" : "No spectra yet"} action={q || status ? undefined : { href: "/upload", label: "Upload exports" }}>
          {q || status ? "Loosen the filter." : "Upload UV-Vis-NIR absorption, PL or mid-IR exports (CSV, text or JCAMP-DX)."}
        </EmptyState>
      ) : (
        <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm">
            <thead className="bg-stone-100 text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr><th className="px-3 py-2">File</th><th className="px-3 py-2">Technique</th><th className="px-3 py-2">Sample</th><th className="px-3 py-2">Project</th><th className="px-3 py-2">State</th><th className="px-3 py-2">Stored</th></tr>
            </thead>
            <tbody>
              {rows.map((s) => (
                <tr key={s.id} className="border-t border-stone-100 hover:bg-stone-50">
                  <td className="max-w-xs truncate px-3 py-2"><Link className="font-medium text-glow-deep hover:underline" href={`/spectra/${s.id}`}>{s.fileName}</Link>
                    {s.errorMessage && <div className="truncate text-xs text-red-700" title={s.errorMessage}>{s.errorMessage}</div>}</td>
                  <td className="px-3 py-2">{TECHNIQUE_LABELS[s.technique] ?? s.technique}</td>
                  <td className="px-3 py-2">{s.sampleName ?? "—"}</td>
                  <td className="px-3 py-2 text-ink-soft">{s.projectName}</td>
                  <td className="px-3 py-2"><StatusBadge status={s.status} /></td>
                  <td className="tabular px-3 py-2 text-ink-soft">{formatWhen(s.createdAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {pages > 1 && (
        <nav aria-label="Pages" className="mt-3 flex items-center gap-3 text-sm">
          {page > 1 && <Link href={link(page - 1)} className="text-glow-deep hover:underline">← Newer</Link>}
          <span className="text-ink-soft">Page {page} of {pages}</span>
          {page < pages && <Link href={link(page + 1)} className="text-glow-deep hover:underline">Older →</Link>}
        </nav>
      )}
    </>
  );
}
