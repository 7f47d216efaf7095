import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { LIGHT_CAUTION } from "@/lib/hazards";
import { getSeriesPoints } from "@/lib/queries/series-detail";
import { linkedHazards, linkedProject, resolveShareLink, type ResolvedLink } from "@/lib/stewardship/shareLinks";
import { HazardNotice } from "@/components/ui/HazardNotice";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { Project, Series, models } from "@/models";
import { formatWhen } from "@/lib/format/dates";
import { countOf } from "@/lib/format/quantity";

// The public, read-only view of one shared project or series. The share is looked up by
// the token's sha256 on every request: revoked, expired or unknown links get the same
// "not valid" page (not-found.tsx, status 404). Nothing here writes.

export const metadata: Metadata = { title: "Shared data" };
export const dynamic = "force-dynamic";

const pct = (v: number | null) => (v === null ? "—" : `${(v * 100).toFixed(1)} %`);

function Banner({ link }: { link: ResolvedLink }) {
  return (
    <p className="mb-4 rounded-md border border-glow/30 bg-glow-soft px-3 py-2 text-sm" data-testid="shared-banner">
      Read-only link shared by <strong>{link.groupName || "a Bandkeep group"}</strong>;{" "}
      {link.expiresAt ? <>expires {formatWhen(link.expiresAt)}</> : <>no expiry date (it works until the group revokes it)</>}.
    </p>
  );
}

async function Cautions({ link }: { link: ResolvedLink }) {
  const { flags, photoluminescence } = await linkedHazards(link.targetType, link.targetId);
  return (
    <div className="mb-4 space-y-2">
      <HazardNotice flags={flags} />
      {photoluminescence && <p className="text-xs text-caution"><span className="font-semibold">⚠ UV and laser light.</span> {LIGHT_CAUTION}</p>}
    </div>
  );
}

const rawHref = (token: string, spectrumId: string) => `/shared/${encodeURIComponent(token)}/raw/${spectrumId}`;

export default async function SharedPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const link = await resolveShareLink(token);
  if (!link) notFound();
  models();

  if (link.targetType === "series") {
    const series = await Series.findByPk(link.targetId);
    if (!series) notFound();
    const project = await Project.findByPk(series.projectId, { attributes: ["name"] });
    const points = await getSeriesPoints(series.id, { withReview: false });
    const variable = `${series.variableName || "Variable"}${series.variableUnit ? ` (${series.variableUnit})` : ""}`;
    return (
      <>
        <Banner link={link} />
        <header className="mb-4">
          <h1 className="text-2xl font-semibold tracking-tight" data-testid="shared-title">{series.name}</h1>
          <p className="mt-1 text-sm text-ink-soft">{project?.name ?? ""} · {series.kind} series · {countOf(points.length, "spectrum")} · variable: {variable}</p>
        </header>
        <Cautions link={link} />
        {points.length === 0 ? <p className="text-sm text-ink-soft">No spectra in this series yet.</p> : (
          <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
            <table className="w-full text-sm" data-testid="shared-series-table">
              <thead className="bg-stone-100 text-left text-xs text-ink-soft">
                <tr><th className="px-3 py-2">{variable}</th><th className="px-3 py-2">Spectrum (raw file)</th><th className="px-3 py-2">Bleach</th><th className="px-3 py-2">PL quench</th><th className="px-3 py-2">Shift (meV)</th><th className="px-3 py-2">State</th></tr>
              </thead>
              <tbody className="tabular">
                {points.map((p) => (
                  <tr key={p.spectrumId} className="border-t border-stone-100">
                    <td className="px-3 py-1.5">{p.value ?? "—"}</td>
                    <td className="px-3 py-1.5"><a className="text-glow-deep hover:underline" href={rawHref(token, p.spectrumId)} rel="noreferrer" download>{p.fileName}</a></td>
                    <td className="px-3 py-1.5">{pct(p.bleachFraction)}</td>
                    <td className="px-3 py-1.5">{pct(p.quenchFraction)}</td>
                    <td className="px-3 py-1.5">{p.shiftMeV === null ? "—" : p.shiftMeV.toFixed(1)}</td>
                    <td className="px-3 py-1.5"><StatusBadge status={p.status} /></td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </>
    );
  }

  const project = await linkedProject(link.targetId);
  if (!project) notFound();
  return (
    <>
      <Banner link={link} />
      <header className="mb-4">
        <h1 className="text-2xl font-semibold tracking-tight" data-testid="shared-title">{project.name}</h1>
        <p className="mt-1 text-sm text-ink-soft">Project · {countOf(project.series.length, "series")} · {countOf(project.spectra.length, "spectrum")}</p>
      </header>
      <Cautions link={link} />
      <h2 className="mb-2 text-base font-semibold">Series</h2>
      {project.series.length === 0 ? <p className="mb-4 text-sm text-ink-soft">No series.</p> : (
        <ul className="mb-6 divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm" data-testid="shared-series-list">
          {project.series.map((s) => <li key={s.id} className="px-3 py-2"><span className="font-medium">{s.name}</span> <span className="text-ink-soft">· {s.kind} · {countOf(s.spectra, "spectrum")}</span></li>)}
        </ul>
      )}
      <h2 className="mb-2 text-base font-semibold">Spectra</h2>
      {project.spectra.length === 0 ? <p className="text-sm text-ink-soft">No spectra.</p> : (
        <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm" data-testid="shared-spectra-table">
            <thead className="bg-stone-100 text-left text-xs text-ink-soft"><tr><th className="px-3 py-2">Spectrum (raw file)</th><th className="px-3 py-2">Technique</th><th className="px-3 py-2">Series</th><th className="px-3 py-2">State</th></tr></thead>
            <tbody>
              {project.spectra.map((s) => (
                <tr key={s.id} className="border-t border-stone-100">
                  <td className="px-3 py-1.5"><a className="text-glow-deep hover:underline" href={rawHref(token, s.id)} rel="noreferrer" download>{s.fileName}</a></td>
                  <td className="px-3 py-1.5">{s.technique}</td>
                  <td className="px-3 py-1.5">{s.seriesName ?? "—"}</td>
                  <td className="px-3 py-1.5"><StatusBadge status={s.status} /></td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
