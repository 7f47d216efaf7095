import { formatWhen } from "@/lib/format/dates";
import type { RunSummary } from "@/lib/queries/spectrum-detail";
import { SidePanel } from "./SidePanel";

const RUN_STATES: Record<string, string> = { queued: "waiting", running: "running", done: "finished", failed: "failed" };

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

/** Every run of the spectrum, newest first, with each finished run's report. */
export function RunsPanel({
  latest,
  shown,
  earlier,
  spectrumId,
}: {
  latest: RunSummary | null;
  shown: RunSummary | null;
  earlier: RunSummary[];
  spectrumId: string;
}) {
  return (
    <SidePanel title="Runs" testId="runs">
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
              <RunLine key={r.id} run={r} spectrumId={spectrumId} />
            ))}
        </ul>
      )}
    </SidePanel>
  );
}
