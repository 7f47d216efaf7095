import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { LIGHT_CAUTION } from "@/lib/hazards";
import { getSeriesPoints } from "@/lib/queries/series-detail";
import { linkedHazards, linkedProject, resolveShareLink, spectrumThroughLink, type ResolvedLink } from "@/lib/stewardship/shareLinks";
import { sharedSpectrumView, sharedSupernatants, type SharedSupernatant } from "@/lib/stewardship/sharedSpectra";
import { SharedSpectrumPanel } from "@/components/shared/SharedSpectrumPanel";
import { HazardNotice } from "@/components/ui/HazardNotice";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { Project, Series } from "@/models";
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
      {photoluminescence && (
        <p className="text-xs text-caution">
          <span className="font-semibold">⚠ UV and laser light.</span> {LIGHT_CAUTION}
        </p>
      )}
    </div>
  );
}

const rawHref = (token: string, spectrumId: string) => `/shared/${encodeURIComponent(token)}/raw/${spectrumId}`;
const plotHref = (token: string, spectrumId: string) => `/shared/${encodeURIComponent(token)}?spectrum=${spectrumId}#plot`;

/** The spectrum to plot: the one asked for when the link covers it, else the first finished one. */
async function Plot({
  token,
  link,
  asked,
  fallback,
}: {
  token: string;
  link: ResolvedLink;
  asked: string | undefined;
  fallback: string | undefined;
}) {
  const id = asked ?? fallback;
  const spectrum = id ? await spectrumThroughLink(link, id) : null;
  if (!spectrum)
    return asked ? (
      <p role="alert" className="mt-6 text-sm text-red-700">
        That spectrum is not part of what this link shares.
      </p>
    ) : null;
  return (
    <section id="plot" className="mt-6" aria-label="Plot">
      <SharedSpectrumPanel token={token} view={await sharedSpectrumView(spectrum)} />
    </section>
  );
}

function PlotLink({ token, id, shown }: { token: string; id: string; shown: boolean }) {
  return shown ? (
    <span className="text-xs font-medium text-ink-soft">plotted below</span>
  ) : (
    <Link prefetch={false} scroll={false} href={plotHref(token, id)} className="text-xs text-glow-deep hover:underline">
      Plot
    </Link>
  );
}

function Supernatants({ token, rows, shown }: { token: string; rows: SharedSupernatant[]; shown: string | undefined }) {
  if (!rows.length) return null;
  return (
    <>
      <h2 className="mb-2 mt-6 text-base font-semibold">Supernatants of the points</h2>
      <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm" data-testid="shared-supernatants">
        {rows.map((r) => (
          <li key={r.id} className="flex flex-wrap items-center gap-3 px-3 py-2">
            <a className="text-glow-deep hover:underline" href={rawHref(token, r.id)} rel="noreferrer" download>
              {r.fileName}
            </a>
            <span className="text-ink-soft">for {r.pointFileName}</span>
            <StatusBadge status={r.status} />
            <PlotLink token={token} id={r.id} shown={shown === r.id} />
          </li>
        ))}
      </ul>
    </>
  );
}

export default async function SharedPage({
  params,
  searchParams,
}: {
  params: Promise<{ token: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { token } = await params;
  const askedRaw = (await searchParams).spectrum;
  const asked = typeof askedRaw === "string" && /^[0-9a-f-]{36}$/i.test(askedRaw) ? askedRaw : undefined;
  const link = await resolveShareLink(token);
  if (!link) notFound();

  if (link.targetType === "series") {
    const series = await Series.findByPk(link.targetId);
    if (!series) notFound();
    const project = await Project.findByPk(series.projectId, { attributes: ["name"] });
    const [points, supernatants] = await Promise.all([getSeriesPoints(series.id, { withReview: false }), sharedSupernatants(link)]);
    const fallback = (points.find((p) => p.status === "analysed") ?? points[0])?.spectrumId;
    const shown = asked ?? fallback;
    const variable = `${series.variableName || "Variable"}${series.variableUnit ? ` (${series.variableUnit})` : ""}`;
    return (
      <>
        <Banner link={link} />
        <header className="mb-4">
          <h1 className="text-2xl font-semibold tracking-tight" data-testid="shared-title">
            {series.name}
          </h1>
          <p className="mt-1 text-sm text-ink-soft">
            {project?.name ?? ""} · {series.kind} series · {countOf(points.length, "spectrum")} · variable: {variable}
          </p>
        </header>
        <Cautions link={link} />
        {points.length === 0 ? (
          <p className="text-sm text-ink-soft">No spectra in this series yet.</p>
        ) : (
          <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
            <table className="w-full text-sm" data-testid="shared-series-table">
              <thead className="bg-stone-100 text-left text-xs text-ink-soft">
                <tr>
                  <th className="px-3 py-2">{variable}</th>
                  <th className="px-3 py-2">Spectrum (raw file)</th>
                  <th className="px-3 py-2">Bleach</th>
                  <th className="px-3 py-2">PL quench</th>
                  <th className="px-3 py-2">Shift (meV)</th>
                  <th className="px-3 py-2">State</th>
                  <th className="px-3 py-2" aria-label="Plot" />
                </tr>
              </thead>
              <tbody className="tabular">
                {points.map((p) => (
                  <tr key={p.spectrumId} className="border-t border-stone-100">
                    <td className="px-3 py-1.5">{p.value ?? "—"}</td>
                    <td className="px-3 py-1.5">
                      <a className="text-glow-deep hover:underline" href={rawHref(token, p.spectrumId)} rel="noreferrer" download>
                        {p.fileName}
                      </a>
                    </td>
                    <td className="px-3 py-1.5">{pct(p.bleachFraction)}</td>
                    <td className="px-3 py-1.5">{pct(p.quenchFraction)}</td>
                    <td className="px-3 py-1.5">{p.shiftMeV === null ? "—" : p.shiftMeV.toFixed(1)}</td>
                    <td className="px-3 py-1.5">
                      <StatusBadge status={p.status} />
                    </td>
                    <td className="px-3 py-1.5">
                      <PlotLink token={token} id={p.spectrumId} shown={shown === p.spectrumId} />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <Supernatants token={token} rows={supernatants} shown={shown} />
        <Plot token={token} link={link} asked={asked} fallback={fallback} />
      </>
    );
  }

  const project = await linkedProject(link.targetId);
  if (!project) notFound();
  const fallback = (project.spectra.find((s) => s.status === "analysed") ?? project.spectra[0])?.id;
  const shown = asked ?? fallback;
  return (
    <>
      <Banner link={link} />
      <header className="mb-4">
        <h1 className="text-2xl font-semibold tracking-tight" data-testid="shared-title">
          {project.name}
        </h1>
        <p className="mt-1 text-sm text-ink-soft">
          Project · {countOf(project.series.length, "series")} · {countOf(project.spectra.length, "spectrum")}
        </p>
      </header>
      <Cautions link={link} />
      <h2 className="mb-2 text-base font-semibold">Series</h2>
      {project.series.length === 0 ? (
        <p className="mb-4 text-sm text-ink-soft">No series.</p>
      ) : (
        <ul className="mb-6 divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm" data-testid="shared-series-list">
          {project.series.map((s) => (
            <li key={s.id} className="px-3 py-2">
              <span className="font-medium">{s.name}</span>{" "}
              <span className="text-ink-soft">
                · {s.kind} · {countOf(s.spectra, "spectrum")}
              </span>
            </li>
          ))}
        </ul>
      )}
      <h2 className="mb-2 text-base font-semibold">Spectra</h2>
      {project.spectra.length === 0 ? (
        <p className="text-sm text-ink-soft">No spectra.</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm" data-testid="shared-spectra-table">
            <thead className="bg-stone-100 text-left text-xs text-ink-soft">
              <tr>
                <th className="px-3 py-2">Spectrum (raw file)</th>
                <th className="px-3 py-2">Technique</th>
                <th className="px-3 py-2">Series</th>
                <th className="px-3 py-2">State</th>
                <th className="px-3 py-2" aria-label="Plot" />
              </tr>
            </thead>
            <tbody>
              {project.spectra.map((s) => (
                <tr key={s.id} className="border-t border-stone-100">
                  <td className="px-3 py-1.5">
                    <a className="text-glow-deep hover:underline" href={rawHref(token, s.id)} rel="noreferrer" download>
                      {s.fileName}
                    </a>
                  </td>
                  <td className="px-3 py-1.5">{s.technique}</td>
                  <td className="px-3 py-1.5">{s.seriesName ?? "—"}</td>
                  <td className="px-3 py-1.5">
                    <StatusBadge status={s.status} />
                  </td>
                  <td className="px-3 py-1.5">
                    <PlotLink token={token} id={s.id} shown={shown === s.id} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <Plot token={token} link={link} asked={asked} fallback={fallback} />
    </>
  );
}
