import { formatWhen } from "@/lib/format/dates";
import type { SpectrumDetail } from "@/lib/queries/spectrum-detail";
import { THRESHOLD_FIELDS } from "@/lib/spectrum-view/rerunSchema";
import { SidePanel } from "./SidePanel";

/** What the shown run was computed with: engine, grid, smoothing, baseline, normalisation, thresholds and its warnings. */
export function ProvenancePanel({ shown }: { shown: SpectrumDetail["shownRun"] }) {
  const p = shown?.report ?? null;
  return (
    <SidePanel title="Analysis provenance" testId="provenance">
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
    </SidePanel>
  );
}
