import type { Metadata } from "next";
import { TECHNIQUE_LABELS, TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import { notFound } from "next/navigation";
import { requireActor } from "@/lib/auth/actor";
import { getSpectrumDetail } from "@/lib/queries/spectrum-detail";
import { isDisplayAxis, type DisplayAxis } from "@/lib/spectrum-view/axis";
import { RerunForm } from "@/components/spectrum/RerunForm";
import { getRerunParents } from "@/lib/queries/parentChoices";
import { DeleteSpectrumForm } from "@/components/stewardship/DeleteSpectrumForm";
import { AcquisitionPanel } from "@/components/spectrum/AcquisitionPanel";
import { ProvenancePanel } from "@/components/spectrum/ProvenancePanel";
import { RunProgress } from "@/components/spectrum/RunProgress";
import { RunsPanel } from "@/components/spectrum/RunsPanel";
import { SamplePanel } from "@/components/spectrum/SamplePanel";
import { SidePanel } from "@/components/spectrum/SidePanel";
import { SpectrumCautions } from "@/components/spectrum/SpectrumCautions";
import { SpectrumViewer } from "@/components/spectrum/SpectrumViewer";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { rerunAnalysis } from "./actions";
import { isUuid } from "@/lib/ids";

export const metadata: Metadata = { title: "Spectrum" };

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
      <SpectrumCautions s={s} />
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
          <SamplePanel s={s} />
          <AcquisitionPanel s={s} />
          <ProvenancePanel shown={shown} />
          <RunsPanel latest={latest} shown={shown} earlier={s.earlierRuns} spectrumId={s.id} />
          {s.mayWrite && s.status !== "failed" && (
            <SidePanel title="Re-run with changed parameters" testId="rerun">
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
            </SidePanel>
          )}
          {s.mayWrite && <DeleteSpectrumForm spectrumId={s.id} />}
        </aside>
      </div>
    </>
  );
}
