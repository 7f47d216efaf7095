import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireActor } from "@/lib/auth/actor";
import { getSpectrumDetail } from "@/lib/queries/spectrum-detail";
import { KIND_LABELS } from "@/lib/signature-labels";
import { HazardNotice } from "@/components/ui/HazardNotice";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";

export const metadata: Metadata = { title: "Spectrum" };

const num = (v: number | null | undefined, digits: number) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toFixed(digits));

export default async function SpectrumPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requireActor(`/spectra/${id}`);
  const s = /^[0-9a-f-]{36}$/i.test(id) ? await getSpectrumDetail(actor, id) : null;
  if (!s) notFound();
  const run = s.latestRun;
  return (
    <>
      <PageHeader
        title={s.fileName}
        subtitle={<span className="flex items-center gap-2">{s.projectName} · {s.technique} <StatusBadge status={s.status} /></span>}
        actions={<a href={`/api/v1/spectra/${s.id}/raw`} className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-50">Download raw file</a>}
      />
      {s.sample && s.sample.hazards.length > 0 && <div className="mb-4"><HazardNotice flags={s.sample.hazards} /></div>}
      {s.status === "failed" && s.errorMessage && (
        <p role="alert" className="mb-4 rounded-md bg-red-50 px-4 py-3 text-sm text-red-800">This file could not be read: {s.errorMessage} The raw file is kept as it arrived.</p>
      )}
      <div className="grid gap-6 xl:grid-cols-3">
        <section className="space-y-4 xl:col-span-2">
          <div className="rounded-lg border border-stone-200 bg-white">
            <h2 className="border-b border-stone-100 px-4 py-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Flagged changes against the parent</h2>
            {s.signatures.length === 0 ? (
              <p className="px-4 py-3 text-sm text-ink-soft">{run?.status === "done" ? (s.reference ? "Nothing differs from the parent beyond the noise." : "No parent reference was set, so nothing was compared.") : "The analysis has not finished."}</p>
            ) : (
              <table className="w-full text-sm" data-testid="flags-table">
                <thead className="text-left text-xs uppercase tracking-wide text-ink-soft"><tr><th className="px-4 py-2">Change</th><th className="px-4 py-2">Energy (eV)</th><th className="px-4 py-2">Fraction</th><th className="px-4 py-2">Shift (meV)</th><th className="px-4 py-2">Significance</th><th className="px-4 py-2">Review</th></tr></thead>
                <tbody className="tabular">
                  {s.signatures.map((g) => (
                    <tr key={g.id} className="border-t border-stone-100">
                      <td className="px-4 py-1.5 font-medium">{KIND_LABELS[g.kind] ?? g.kind}</td>
                      <td className="px-4 py-1.5">{num(g.energyEv, 3)}</td>
                      <td className="px-4 py-1.5">{g.fraction === null ? "—" : `${(g.fraction * 100).toFixed(1)} %`}</td>
                      <td className="px-4 py-1.5">{num(g.shiftMeV, 1)}</td>
                      <td className="px-4 py-1.5">{num(g.significance, 1)}σ</td>
                      <td className="px-4 py-1.5"><StatusBadge status={g.reviewState} /></td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </div>
          <div className="rounded-lg border border-stone-200 bg-white">
            <h2 className="border-b border-stone-100 px-4 py-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Excitonic peaks</h2>
            {s.peaks.length === 0 ? (
              <p className="px-4 py-3 text-sm text-ink-soft">No peaks found{run?.status === "done" ? "" : " yet"}.</p>
            ) : (
              <table className="w-full text-sm" data-testid="peaks-table">
                <thead className="text-left text-xs uppercase tracking-wide text-ink-soft"><tr><th className="px-4 py-2">Energy (eV)</th><th className="px-4 py-2">Wavelength (nm)</th><th className="px-4 py-2">Height</th><th className="px-4 py-2">FWHM (meV)</th><th className="px-4 py-2"></th></tr></thead>
                <tbody className="tabular">
                  {s.peaks.map((p) => (
                    <tr key={p.id} className="border-t border-stone-100">
                      <td className="px-4 py-1.5">{num(p.energyEv, 3)}</td><td className="px-4 py-1.5">{num(p.wavelengthNm, 1)}</td>
                      <td className="px-4 py-1.5">{num(p.height, 4)}</td><td className="px-4 py-1.5">{num(p.fwhmMeV, 0)}</td>
                      <td className="px-4 py-1.5 text-xs text-glow-deep">{p.isFirstExciton ? "first exciton" : ""}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </div>
        </section>
        <aside className="space-y-4">
          <section className="rounded-lg border border-stone-200 bg-white p-4 text-sm">
            <h2 className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Sample and parent</h2>
            <p>Sample: {s.sample ? <Link className="text-glow-deep hover:underline" href={`/samples/${s.sample.id}`}>{s.sample.name}</Link> : "—"}</p>
            <p>Parent reference: {s.reference ? <Link className="text-glow-deep hover:underline" href={`/spectra/${s.reference.id}`}>{s.reference.fileName}</Link> : "none set"}</p>
          </section>
          <section className="rounded-lg border border-stone-200 bg-white p-4 text-sm">
            <h2 className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Acquisition</h2>
            <dl className="grid grid-cols-[7rem_1fr] gap-y-1">
              {s.acquisition.map((a) => (<div key={a.label} className="contents"><dt className="text-ink-soft">{a.label}</dt><dd>{a.value}</dd></div>))}
              <dt className="text-ink-soft">sha256</dt><dd className="truncate font-mono text-xs" title={s.sha256}>{s.sha256}</dd>
              <dt className="text-ink-soft">Size</dt><dd>{(s.sizeBytes / 1024).toFixed(1)} KiB</dd>
            </dl>
          </section>
          <section className="rounded-lg border border-stone-200 bg-white p-4 text-sm">
            <h2 className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Analysis provenance</h2>
            {run ? (
              <dl className="grid grid-cols-[7rem_1fr] gap-y-1">
                <dt className="text-ink-soft">Engine</dt><dd>{run.engineVersion}</dd>
                <dt className="text-ink-soft">State</dt><dd>{run.status}</dd>
                <dt className="text-ink-soft">Noise (σ)</dt><dd className="tabular">{run.noise === null ? "—" : run.noise.toExponential(2)}</dd>
                <dt className="text-ink-soft">Finished</dt><dd>{run.finishedAt ? new Date(run.finishedAt).toLocaleString("en-GB") : "—"}</dd>
                <dt className="text-ink-soft">Took</dt><dd>{run.durationMs === null ? "—" : `${run.durationMs} ms`}</dd>
                <dt className="text-ink-soft">Parameters</dt><dd className="truncate font-mono text-xs" title={JSON.stringify(run.parameters)}>{run.parameterHash.slice(0, 12)}</dd>
              </dl>
            ) : <p className="text-ink-soft">Not analysed yet.</p>}
            {run?.warnings.length ? <ul className="mt-2 list-disc pl-5 text-xs text-caution">{run.warnings.map((w) => <li key={w}>{w}</li>)}</ul> : null}
            {s.earlierRuns.length > 0 && <p className="mt-2 text-xs text-ink-soft">{s.earlierRuns.length} earlier run(s) kept for provenance.</p>}
          </section>
        </aside>
      </div>
    </>
  );
}
