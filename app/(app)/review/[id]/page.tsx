import type { Metadata } from "next";
import Link from "next/link";
import { Fragment } from "react";
import { notFound } from "next/navigation";
import { requireActor } from "@/lib/auth/actor";
import { getSignatureReview, type ReviewHistoryEntry } from "@/lib/queries/review";
import { loadEvidence } from "@/lib/review/loadEvidence";
import { kindLabel } from "@/lib/registry/flagKinds";
import { DecisionForm } from "@/components/review/DecisionForm";
import { EvidenceChart } from "@/components/review/EvidenceChart";
import { formatFlagMagnitude, formatFlagUncertainty } from "@/lib/format/quantity";
import { TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import { formatPosition } from "@/lib/spectrum-view/axis";
import { formatWhen } from "@/lib/format/dates";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { isUuid } from "@/lib/ids";

export const metadata: Metadata = { title: "Signature" };

function historyWho(h: ReviewHistoryEntry): string {
  if (h.origin === "carried") return "decision carried by the analysis";
  if (h.origin === "not-carried") return "decision held back by the analysis";
  const who = h.reviewerName ?? "a former member";
  return h.origin === "undo" ? `${who} undid a decision` : who;
}

export default async function SignaturePage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requireActor(`/review/${id}`);
  const sig = isUuid(id) ? await getSignatureReview(actor, id) : null;
  if (!sig) notFound();
  const evidence = await loadEvidence(sig.spectrumId, sig.referenceSpectrumId, sig.energyEv);
  const label = kindLabel(sig.kind, sig.technique);
  const latest = sig.history[0];
  const undoableReviewId = latest && latest.origin === "decision" && latest.previousState !== null ? latest.id : null;
  const facts: [string, string][] = [
    ["Magnitude", formatFlagMagnitude(sig)],
    [
      "Position",
      sig.energyEv === null
        ? "—"
        : TECHNIQUE_SPECS[sig.technique].defaultAxis === "cm-1"
          ? `${formatPosition(sig.energyEv, "cm-1")} (${formatPosition(sig.energyEv, "ev")})`
          : `${formatPosition(sig.energyEv, "ev")} (${formatPosition(sig.energyEv, "nm")})`,
    ],
    [
      "Significance",
      `${sig.significance.toFixed(1)}σ${sig.uncertainty !== null ? ` (standard uncertainty ${formatFlagUncertainty(sig, TECHNIQUE_SPECS[sig.technique].valueWord)})` : ""}`,
    ],
    ["Sample", sig.sampleName ?? "—"],
    ["Project", sig.projectName],
    ["Flagged", formatWhen(sig.createdAt)],
  ];
  return (
    <>
      <PageHeader
        title={`${label} in ${sig.fileName}`}
        subtitle={sig.message ?? undefined}
        actions={
          <Link href="/review" className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-50">
            ← Review queue
          </Link>
        }
      />
      {sig.supersededBy && (
        <div role="note" data-testid="superseded-notice" className="mb-4 rounded-lg border border-amber-300 bg-amber-50 px-4 py-3 text-sm">
          <p className="font-medium">
            Replaced by a newer analysis: run {sig.supersededBy.runId.slice(0, 8)}, {formatWhen(sig.supersededBy.at)}.
          </p>
          <p className="mt-1">
            {sig.supersededBy.matchId ? (
              <>
                That run found the same band:{" "}
                <Link className="text-glow-deep hover:underline" href={`/review/${sig.supersededBy.matchId}`}>
                  its signature
                </Link>
                {sig.supersededBy.matchState && (
                  <>
                    {" "}
                    (now <StatusBadge status={sig.supersededBy.matchState} />)
                  </>
                )}
                .{" "}
              </>
            ) : (
              <>That run no longer finds this band. </>
            )}
            This flag is off the queue and out of every count; its history below stays as it was.
          </p>
        </div>
      )}
      <div className="grid gap-6 lg:grid-cols-3">
        <section className="rounded-lg border border-stone-200 bg-white p-4 lg:col-span-2">
          <h2 className="mb-2 text-sm font-semibold text-ink-soft">Evidence</h2>
          <p className="mb-2 text-xs text-ink-soft">
            <Link className="text-glow-deep hover:underline" href={`/spectra/${sig.spectrumId}`}>
              {sig.fileName}
            </Link>
            {sig.referenceSpectrumId && (
              <>
                {" "}
                against its reference{" "}
                <Link className="text-glow-deep hover:underline" href={`/spectra/${sig.referenceSpectrumId}`}>
                  {sig.referenceFileName}
                </Link>
              </>
            )}
            {sig.energyEv !== null ? ", within 0.3 eV of the flag (marked)." : ", whole range."}
          </p>
          {evidence.problem ? (
            <p className="text-sm text-ink-soft">{evidence.problem}</p>
          ) : (
            <EvidenceChart
              energy={evidence.energy}
              sample={evidence.sample}
              reference={evidence.reference}
              centreEv={evidence.centreEv}
              sampleName={evidence.sampleName}
              referenceName={evidence.referenceName}
              unit={evidence.unit}
              kind={sig.kind}
              technique={sig.technique}
            />
          )}
          <dl className="mt-4 grid grid-cols-[8rem_1fr] gap-y-1 text-sm">
            {facts.map(([k, v]) => (
              <Fragment key={k}>
                <dt className="text-ink-soft">{k}</dt>
                <dd className="tabular">{v}</dd>
              </Fragment>
            ))}
          </dl>
        </section>
        <div className="space-y-6">
          <section className="rounded-lg border border-stone-200 bg-white p-4">
            <h2 className="mb-2 text-sm font-semibold text-ink-soft">Decision</h2>
            {sig.mayDecide ? (
              <DecisionForm signatureId={sig.id} reviewState={sig.reviewState} undoableReviewId={undoableReviewId} />
            ) : (
              <p className="text-sm">
                {sig.supersededBy ? "Last state" : "Now"}: <StatusBadge status={sig.reviewState} />
                <br />
                <span className="text-ink-soft">
                  {sig.supersededBy ? "A replaced flag is no longer decided on." : "A lead of the group decides on signatures."}
                </span>
              </p>
            )}
            {sig.matchedSignatureId && (
              <p className="mt-3 text-xs text-ink-soft">
                The same band in the run before:{" "}
                <Link className="text-glow-deep hover:underline" href={`/review/${sig.matchedSignatureId}`}>
                  earlier signature
                </Link>
                .
              </p>
            )}
          </section>
          <section className="rounded-lg border border-stone-200 bg-white p-4">
            <h2 className="mb-2 text-sm font-semibold text-ink-soft">History</h2>
            {sig.history.length === 0 ? (
              <p className="text-sm text-ink-soft">No decision yet.</p>
            ) : (
              <ol className="space-y-3 text-sm" data-testid="review-history">
                {sig.history.map((h) => (
                  <li key={h.id} className="border-l-2 border-stone-200 pl-3">
                    <div className="flex flex-wrap items-center gap-2">
                      <StatusBadge status={h.decision} />
                      <span className="text-ink-soft">
                        {historyWho(h)} · {formatWhen(h.createdAt)}
                      </span>
                    </div>
                    {h.carriedFromSignatureId && (
                      <p className="mt-1 text-xs">
                        <Link className="text-glow-deep hover:underline" href={`/review/${h.carriedFromSignatureId}`}>
                          {h.origin === "carried" ? "carried from" : "not carried from"} run{" "}
                          {h.carriedFromRunId?.slice(0, 8) ?? "(deleted)"}
                        </Link>
                      </p>
                    )}
                    {h.origin === "carried" ? null : h.comment ? (
                      <p className="mt-1 whitespace-pre-wrap">{h.comment}</p>
                    ) : (
                      <p className="mt-1 text-ink-faint">No comment.</p>
                    )}
                  </li>
                ))}
              </ol>
            )}
          </section>
        </div>
      </div>
    </>
  );
}
