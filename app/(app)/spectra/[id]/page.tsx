import type { Metadata } from "next";
import { TECHNIQUE_LABELS, TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireActor } from "@/lib/auth/actor";
import { LIGHT_CAUTION, usesUvOrLaserLight } from "@/lib/hazards";
import { formatBytes } from "@/lib/format/bytes";
import { getSpectrumDetail, type RunSummary } from "@/lib/queries/spectrum-detail";
import { isDisplayAxis, type DisplayAxis } from "@/lib/spectrum-view/axis";
import { THRESHOLD_FIELDS } from "@/lib/spectrum-view/rerunSchema";
import { RerunForm } from "@/components/spectrum/RerunForm";
import { getRerunParents } from "@/lib/queries/parentChoices";
import { DeleteSpectrumForm } from "@/components/stewardship/DeleteSpectrumForm";
import { RunProgress } from "@/components/spectrum/RunProgress";
import { SpectrumViewer } from "@/components/spectrum/SpectrumViewer";
import { HazardNotice } from "@/components/ui/HazardNotice";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { rerunAnalysis } from "./actions";
import { formatWhen } from "@/lib/format/dates";
import { isUuid } from "@/lib/ids";

export const metadata: Metadata = { title: "Spectrum" };

const RUN_STATES: Record<string, string> = { queued: "waiting", running: "running", done: "finished", failed: "failed" };

function Panel({ title, children, testId }: { title: string; children: React.ReactNode; testId?: string }) {
  return (
    <section className="rounded-lg border border-stone-200 bg-white p-4 text-sm" data-testid={testId}>
      <h2 className="mb-2 text-sm font-semibold text-ink-soft">{title}</h2>
      {children}
    </section>
  );
}

function RunLine({ run, spectrumId }: { run: RunSummary; spectrumId: string }) {
  return (
    <li className="border-t border-stone-100 py-1.5 first:border-t-0">
      <div className="flex items-center justify-between gap-2">
        <span className="font-mono text-xs" title={run.id}>
          {run.id.slice(0, 8)}
        </span>
        <span className="text-xs text-ink-soft">
          {RUN_STATES[run.status] ?? run.status} · engine {run.engineVersion}
        </span>
      </div>
      <div className="flex items-center justify-between gap-2 text-xs text-ink-faint">
        <span>
          {formatWhen(run.finishedAt ?? run.createdAt)}
          {run.requestedBy ? ` · ${run.requestedBy}` : ""}
        </span>
        {run.status === "done" && (
          <a className="text-glow-deep hover:underline" href={`/api/v1/spectra/${spectrumId}/export?format=json&run=${run.id}`}>
            report JSON
          </a>
        )}
      </div>
      {run.status === "failed" && run.errorMessage && <p className="text-xs text-red-800">{run.errorMessage}</p>}
    </li>
  );
}

export default async function SpectrumPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { id } = await params;
  const query = await searchParams;
  const actor = await requireActor(`/spectra/${id}`);
  const s = isUuid(id) ? await getSpectrumDetail(actor, id) : null;
  if (!s) notFound();
  const latest = s.latestRun;
  const shown = s.shownRun;
  const p = shown?.report ?? null;
  const defaultAxis: DisplayAxis = TECHNIQUE_SPECS[s.technique].defaultAxis;
  const initialAxis = isDisplayAxis(query.axis) ? query.axis : defaultAxis;
  // the trade's direction for the technique's own axis (mid-IR high to low), low to high otherwise; ?dir= overrides
  const initialDirection =
    query.dir === "asc"
      ? "ascending"
      : query.dir === "desc"
        ? "descending"
        : initialAxis === defaultAxis
          ? TECHNIQUE_SPECS[s.technique].defaultDirection
          : "ascending";
  const inProgress = latest !== null && (latest.status === "queued" || latest.status === "running");
  const hasReference = shown ? shown.referenceSpectrumId !== null : false;
  // requestReanalysis starts from the latest run that did not fail (else the latest), reference included
  const rerunBase = [latest, ...s.earlierRuns].find((r) => r && r.status !== "failed") ?? latest;
  const rerunHasReference = rerunBase ? rerunBase.referenceSpectrumId !== null : s.reference !== null;
  const rerunParents = s.mayWrite && s.status !== "failed" ? await getRerunParents(s.id) : null;
  const analysisNote = shown
    ? null
    : s.status === "failed"
      ? `No curves to draw: this file could not be read. ${s.errorMessage ?? latest?.errorMessage ?? ""}`
      : latest?.status === "failed"
        ? `No curves to draw: the analysis failed. ${latest.errorMessage ?? ""}`
        : "The analysis has not finished yet; the curves appear here when it has.";
  const earlier = s.earlierRuns;

  return (
    <>
      <PageHeader
        title={s.fileName}
        subtitle={
          <span className="flex items-center gap-2">
            {s.projectName} · {TECHNIQUE_LABELS[s.technique]} <StatusBadge status={s.status} />
          </span>
        }
        actions={
          <a
            href={`/api/v1/spectra/${s.id}/raw`}
            className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-50"
          >
            Download raw file
          </a>
        }
      />
      {s.sample && s.sample.hazards.length > 0 && (
        <div className="mb-4">
          <HazardNotice flags={s.sample.hazards} />
        </div>
      )}
      {usesUvOrLaserLight(s.technique) && (
        <p role="note" aria-label="Light safety" className="mb-4 rounded-lg border border-caution/40 bg-caution-soft px-4 py-2 text-sm">
          <span className="font-semibold text-caution">⚠ UV and laser light.</span> {LIGHT_CAUTION} Your institution&apos;s laser safety
          rules take precedence.
        </p>
      )}
      {s.status === "failed" && s.errorMessage && (
        <p role="alert" className="mb-4 rounded-md bg-red-50 px-4 py-3 text-sm text-red-800">
          This file could not be read: {s.errorMessage} The raw file is kept as it arrived.
        </p>
      )}
      {inProgress && (
        <div className="mb-4">
          <RunProgress spectrumId={s.id} />
        </div>
      )}
      <div className="grid gap-6 xl:grid-cols-3">
        <div className="min-w-0 xl:col-span-2">
          <SpectrumViewer
            spectrumId={s.id}
            technique={s.technique}
            initialDirection={initialDirection}
            runId={shown?.id ?? null}
            initialAxis={initialAxis}
            peaks={s.peaks}
            flags={s.signatures}
            hasReference={hasReference}
            analysisNote={analysisNote}
          />
        </div>
        <aside className="space-y-4">
          <Panel title="Sample and parents" testId="sample-panel">
            {s.sample ? (
              <dl className="grid grid-cols-[7rem_1fr] gap-y-1">
                <dt className="text-ink-soft">Sample</dt>
                <dd>
                  <Link className="text-glow-deep hover:underline" href={`/samples/${s.sample.id}`}>
                    {s.sample.name}
                  </Link>
                </dd>
                <dt className="text-ink-soft">Material</dt>
                <dd>
                  {s.sample.material}
                  {s.sample.coreShell ? ` (${s.sample.coreShell})` : ""}
                </dd>
                {s.sample.ligand && (
                  <>
                    <dt className="text-ink-soft">Ligand</dt>
                    <dd>{s.sample.ligand}</dd>
                  </>
                )}
                {s.sample.solvent && (
                  <>
                    <dt className="text-ink-soft">Solvent</dt>
                    <dd>{s.sample.solvent}</dd>
                  </>
                )}
                <dt className="text-ink-soft">Parent samples</dt>
                <dd>
                  {s.sample.parents.length === 0 ? (
                    "none (as-made)"
                  ) : (
                    <ul>
                      {s.sample.parents.map((pa) => (
                        <li key={pa.id}>
                          <Link className="text-glow-deep hover:underline" href={`/samples/${pa.id}`}>
                            {pa.name}
                          </Link>{" "}
                          <span className="text-ink-faint">{pa.material}</span>
                        </li>
                      ))}
                    </ul>
                  )}
                </dd>
              </dl>
            ) : (
              <p className="text-ink-soft">No sample registered for this spectrum.</p>
            )}
            <p className="mt-2">
              Parent reference spectrum:{" "}
              {s.reference ? (
                <Link className="text-glow-deep hover:underline" href={`/spectra/${s.reference.id}`}>
                  {s.reference.fileName}
                </Link>
              ) : (
                <span className="text-ink-soft">none set</span>
              )}
            </p>
            {s.supernatantOf && (
              <p className="mt-2" data-testid="supernatant-of">
                Supernatant of{" "}
                <Link className="text-glow-deep hover:underline" href={`/spectra/${s.supernatantOf.spectrumId}`}>
                  {s.supernatantOf.fileName}
                </Link>
                , a point of the series{" "}
                <Link className="text-glow-deep hover:underline" href={`/series/${s.supernatantOf.seriesId}`}>
                  {s.supernatantOf.seriesName}
                </Link>{" "}
                (read for its depletion composition)
              </p>
            )}
          </Panel>
          <Panel title="Acquisition">
            <dl className="grid grid-cols-[7rem_1fr] gap-y-1">
              {s.acquisition.map((a) => (
                <div key={a.label} className="contents">
                  <dt className="text-ink-soft">{a.label}</dt>
                  <dd>{a.value}</dd>
                </div>
              ))}
              <dt className="text-ink-soft">Uploaded</dt>
              <dd>{formatWhen(s.createdAt)}</dd>
              <dt className="text-ink-soft">sha256</dt>
              <dd className="truncate font-mono text-xs" title={s.sha256}>
                {s.sha256}
              </dd>
              <dt className="text-ink-soft">Size</dt>
              <dd>{formatBytes(s.sizeBytes)}</dd>
            </dl>
          </Panel>
          <Panel title="Analysis provenance" testId="provenance">
            {shown ? (
              <dl className="grid grid-cols-[7rem_1fr] gap-y-1">
                <dt className="text-ink-soft">Run</dt>
                <dd className="font-mono text-xs" title={shown.id}>
                  {shown.id.slice(0, 8)}
                </dd>
                <dt className="text-ink-soft">Engine</dt>
                <dd>{shown.engineVersion}</dd>
                <dt className="text-ink-soft">Asked by</dt>
                <dd>{shown.requestedBy ?? "upload"}</dd>
                <dt className="text-ink-soft">Finished</dt>
                <dd>{formatWhen(shown.finishedAt)}</dd>
                <dt className="text-ink-soft">Took</dt>
                <dd>{shown.durationMs === null ? "—" : `${shown.durationMs} ms`}</dd>
                <dt className="text-ink-soft">Noise (σ)</dt>
                <dd className="tabular">{shown.noise === null ? "—" : shown.noise.toExponential(2)}</dd>
                {p && (
                  <>
                    <dt className="text-ink-soft">Grid</dt>
                    <dd className="tabular">
                      {p.gridPoints ?? "—"} points, {p.stepMeV === null ? "—" : p.stepMeV.toPrecision(3)} meV apart
                    </dd>
                    <dt className="text-ink-soft">Smoothing</dt>
                    <dd className="tabular">
                      Savitzky–Golay, {p.windowSize ?? "—"} points, order {p.polynomial ?? "—"}; derivatives {p.derivativeWindowSize ?? "—"}{" "}
                      points
                    </dd>
                    <dt className="text-ink-soft">Baseline</dt>
                    <dd>{p.baseline ?? "—"}</dd>
                    <dt className="text-ink-soft">Normalisation</dt>
                    <dd data-testid="provenance-normalization">{p.normalization ?? "—"}</dd>
                    <dt className="text-ink-soft">Flag when at least</dt>
                    <dd className="tabular text-xs">
                      {THRESHOLD_FIELDS.filter((f) => p.thresholds[f.name] !== undefined).map((f) => (
                        <span key={f.name} className="block">
                          {f.label.replace(/^Least /, "")}: {p.thresholds[f.name]}
                        </span>
                      ))}
                    </dd>
                    {p.excitationNm !== null && (
                      <>
                        <dt className="text-ink-soft">Excitation</dt>
                        <dd>{p.excitationNm} nm</dd>
                      </>
                    )}
                    {p.material && (
                      <>
                        <dt className="text-ink-soft">Material</dt>
                        <dd>{p.material}</dd>
                      </>
                    )}
                  </>
                )}
                <dt className="text-ink-soft">Parameter hash</dt>
                <dd className="truncate font-mono text-xs" title={shown.parameterHash}>
                  {shown.parameterHash.slice(0, 12)}
                </dd>
              </dl>
            ) : (
              <p className="text-ink-soft">No finished analysis yet.</p>
            )}
            {shown?.warnings.length ? (
              <ul className="mt-2 list-disc pl-5 text-xs text-caution">
                {shown.warnings.map((w) => (
                  <li key={w}>{w}</li>
                ))}
              </ul>
            ) : null}
          </Panel>
          <Panel title="Runs" testId="runs">
            {latest && latest.id !== shown?.id && (
              <p className="mb-1 text-xs text-ink-soft">Latest run ({RUN_STATES[latest.status] ?? latest.status}) is not the one shown.</p>
            )}
            {earlier.length === 0 && latest?.id === shown?.id ? (
              <p className="text-ink-soft">Only the run shown.</p>
            ) : (
              <ul>
                {[latest, ...earlier]
                  .filter((r): r is RunSummary => Boolean(r))
                  .map((r) => (
                    <RunLine key={r.id} run={r} spectrumId={s.id} />
                  ))}
              </ul>
            )}
          </Panel>
          {s.mayWrite && s.status !== "failed" && (
            <Panel title="Re-run with changed parameters" testId="rerun">
              <RerunForm
                spectrumId={s.id}
                action={rerunAnalysis}
                hasReference={rerunHasReference}
                parents={
                  rerunParents
                    ? { ...rerunParents, currentId: rerunBase ? rerunBase.referenceSpectrumId : (s.reference?.id ?? null) }
                    : undefined
                }
                current={{
                  windowSize: p?.windowSize ?? null,
                  polynomial: p?.polynomial ?? null,
                  baseline: p?.baseline?.replace(" (not applied)", "") ?? null,
                  thresholds: p?.thresholds ?? {},
                  normalization: p?.normalizationBrief ?? null,
                }}
              />
            </Panel>
          )}
          {s.mayWrite && <DeleteSpectrumForm spectrumId={s.id} />}
        </aside>
      </div>
    </>
  );
}
