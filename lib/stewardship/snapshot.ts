import { selectRows } from "@/lib/db";
import type { ActiveHold, DataClass, PolicyRule, RetainedItem } from "./types";

// Reads what the pure planner needs from the database, in one consistent shape.

export type Snapshot = { items: RetainedItem[]; policies: PolicyRule[]; holds: ActiveHold[] };

type SpectrumRow = {
  id: string;
  project_id: string;
  series_id: string | null;
  sample_id: string | null;
  reference_spectrum_id: string | null;
  created_at: Date;
  size_bytes: string;
  file_name: string;
  status: string;
  busy: boolean;
  decision: string | null;
  flagged: boolean;
};
type RunRow = {
  id: string;
  spectrum_id: string;
  project_id: string;
  series_id: string | null;
  sample_id: string | null;
  created_at: Date;
  size_bytes: string | null;
  file_name: string;
  busy: boolean;
  decision: string | null;
  flagged: boolean;
};

/**
 * A spectrum's series; a supernatant belongs to its point's series (holds and policies on the
 * series cover it). A lookup by primary key for the few supernatants, not a second scan of spectra.
 */
const SERIES_OF_SPECTRUM = `COALESCE(s.series_id, (SELECT point.series_id FROM spectra point WHERE point.id = s.supernatant_of_spectrum_id))`;

/**
 * Spectra, analyses, policies and active holds of the given projects (all projects when omitted).
 * `spectraOnly` leaves the analyses out, for a question about raw files or drafts alone (what a
 * spectrum's fate depends on — holds, references, decisions — is all on spectrum rows).
 */
export async function loadSnapshot(projectIds?: readonly string[], options: { spectraOnly?: boolean } = {}): Promise<Snapshot> {
  const scoped = projectIds !== undefined;
  const ids = projectIds && projectIds.length > 0 ? [...projectIds] : ["00000000-0000-0000-0000-000000000000"];
  const scope = (col: string) => (scoped ? `${col} IN (:ids)` : "TRUE");
  const spectra = await selectRows<SpectrumRow>(
    `SELECT s.id, s.project_id, ${SERIES_OF_SPECTRUM} AS series_id, s.sample_id, s.reference_spectrum_id, s.created_at, s.size_bytes, s.file_name, s.status,
            (s.status IN ('queued', 'analysing') OR EXISTS (SELECT 1 FROM analysis_runs r WHERE r.spectrum_id = s.id AND r.status IN ('queued', 'running'))) AS busy,
            f.decision, (f.id IS NOT NULL AND f.decision IS NULL) AS flagged
       FROM spectra s
       LEFT JOIN retention_flags f ON f.target_type = 'spectrum' AND f.target_id = s.id
      WHERE (${scope("s.project_id")}
             -- spectra elsewhere that depend on a spectrum in scope: they stay, and protect it
             -- (a probe of the reference by key: an IN over every spectrum in scope is not hashed past
             -- work_mem and was scanned once per row at 10⁶ spectra)
             OR EXISTS (SELECT 1 FROM spectra ref WHERE ref.id = s.reference_spectrum_id AND ${scope("ref.project_id")}))
        AND NOT EXISTS (SELECT 1 FROM tombstones t WHERE t.target_type = 'spectrum' AND t.target_id = s.id AND t.state = 'pending')`,
    { ids },
  );
  const runs = options.spectraOnly
    ? []
    : await selectRows<RunRow>(
        `SELECT r.id, r.spectrum_id, s.project_id, ${SERIES_OF_SPECTRUM} AS series_id, s.sample_id, r.created_at, octet_length(r.report::text) AS size_bytes, s.file_name,
            r.status IN ('queued', 'running') AS busy, f.decision, (f.id IS NOT NULL AND f.decision IS NULL) AS flagged
       FROM analysis_runs r JOIN spectra s ON s.id = r.spectrum_id
       LEFT JOIN retention_flags f ON f.target_type = 'analysis-run' AND f.target_id = r.id
      WHERE ${scope("s.project_id")}`,
        { ids },
      );
  const policies = await selectRows<{
    id: string;
    project_id: string;
    data_class: DataClass;
    keep_days: number;
    on_expiry: "delete" | "flag";
  }>(`SELECT id, project_id, data_class, keep_days, on_expiry FROM retention_policies WHERE ${scope("project_id")}`, { ids });
  const holds = await selectRows<{ id: string; target_type: ActiveHold["targetType"]; target_id: string; reason: string }>(
    "SELECT id, target_type, target_id, reason FROM legal_holds WHERE lifted_at IS NULL ORDER BY placed_at",
  );
  const inScope = new Set(scoped ? ids : []);
  const items: RetainedItem[] = [
    ...spectra.map((s): RetainedItem => ({
      kind: "spectrum",
      id: s.id,
      dataClass: s.status === "failed" ? "drafts" : "raw",
      projectId: s.project_id,
      spectrumId: s.id,
      seriesId: s.series_id,
      sampleId: s.sample_id,
      referenceSpectrumId: s.reference_spectrum_id,
      createdAt: new Date(s.created_at),
      sizeBytes: Number(s.size_bytes),
      label: s.file_name,
      busy: s.busy,
      keptByDecision: s.decision === "keep",
      flagged: s.flagged,
    })),
    ...runs.map((r): RetainedItem => ({
      kind: "analysis-run",
      id: r.id,
      dataClass: "processed",
      projectId: r.project_id,
      spectrumId: r.spectrum_id,
      seriesId: r.series_id,
      sampleId: r.sample_id,
      referenceSpectrumId: null,
      createdAt: new Date(r.created_at),
      sizeBytes: Number(r.size_bytes ?? 0),
      label: `analysis of ${r.file_name}`,
      busy: r.busy,
      keptByDecision: r.decision === "keep",
      flagged: r.flagged,
    })),
  ];
  return {
    // Items pulled in only as dependents are governed by no policy of this scope.
    items,
    policies: policies
      .filter((p) => !scoped || inScope.has(p.project_id))
      .map((p) => ({ id: p.id, projectId: p.project_id, dataClass: p.data_class, keepDays: p.keep_days, onExpiry: p.on_expiry })),
    holds: holds.map((h) => ({ id: h.id, targetType: h.target_type, targetId: h.target_id, reason: h.reason })),
  };
}
