import { selectRows } from "@/lib/db";
import type { Technique } from "@/lib/engine";
import type { ParentCandidate, ParentTarget } from "@/lib/parents/orderParentChoices";

type Row = {
  id: string;
  project_id: string;
  file_name: string;
  technique: Technique;
  sample_id: string | null;
  sample_name: string | null;
  material: string | null;
  created_at: Date;
  first_exciton_ev: number | null;
  fwhm_mev: number | null;
  min_ev: number | null;
  max_ev: number | null;
};

/**
 * Spectra of the given projects that may serve as a parent reference, by project: analysed ones
 * only (a failed or unreadable upload, such as the parts of an unpacked spreadsheet, never is),
 * with the first exciton and range of their newest finished analysis. Access must have been
 * checked by the caller (the projects are ones the actor writes to).
 */
export async function listParentCandidates(projectIds: readonly string[], limitPerProject = 300): Promise<Map<string, ParentCandidate[]>> {
  const out = new Map<string, ParentCandidate[]>();
  if (projectIds.length === 0) return out;
  const rows = await selectRows<Row>(
    `SELECT * FROM (
       SELECT s.id, s.project_id, s.file_name, s.technique, s.sample_id, sm.name AS sample_name, sm.material, s.created_at,
              fx.energy_ev AS first_exciton_ev, fx.fwhm_mev, run.min_ev, run.max_ev,
              row_number() OVER (PARTITION BY s.project_id ORDER BY s.created_at DESC) AS n
         FROM spectra s
         LEFT JOIN samples sm ON sm.id = s.sample_id
         JOIN LATERAL (
           SELECT r.id, (r.report #>> '{parameters,grid,minEv}')::float8 AS min_ev, (r.report #>> '{parameters,grid,maxEv}')::float8 AS max_ev
             FROM analysis_runs r WHERE r.spectrum_id = s.id AND r.status = 'done' ORDER BY r.created_at DESC LIMIT 1
         ) run ON true
         LEFT JOIN LATERAL (SELECT p.energy_ev, p.fwhm_mev FROM peaks p WHERE p.run_id = run.id AND p.is_first_exciton LIMIT 1) fx ON true
        WHERE s.project_id IN (:projectIds) AND s.status = 'analysed'
     ) ranked WHERE n <= :limit`,
    { projectIds: [...projectIds], limit: limitPerProject },
  );
  for (const r of rows) {
    const list = out.get(r.project_id) ?? [];
    list.push({
      id: r.id,
      fileName: r.file_name,
      technique: r.technique,
      sampleId: r.sample_id,
      sampleName: r.sample_name,
      material: r.material,
      createdAt: new Date(r.created_at).toISOString(),
      firstExcitonEv: r.first_exciton_ev,
      fwhmMeV: r.fwhm_mev,
      rangeEv: r.min_ev !== null && r.max_ev !== null ? [r.min_ev, r.max_ev] : null,
    });
    out.set(r.project_id, list);
  }
  return out;
}

/** Parent samples of each given sample. */
export async function parentSampleIds(sampleIds: readonly string[]): Promise<Map<string, string[]>> {
  const out = new Map<string, string[]>();
  if (sampleIds.length === 0) return out;
  const rows = await selectRows<{ sample_id: string; parent_id: string }>(
    `SELECT sample_id, parent_id FROM sample_parents WHERE sample_id IN (:ids)`,
    { ids: [...sampleIds] },
  );
  for (const r of rows) out.set(r.sample_id, [...(out.get(r.sample_id) ?? []), r.parent_id]);
  return out;
}

/**
 * The re-run form's parent picker for one spectrum (caller checked write access): candidates of
 * its project, and the spectrum as a target, with its own range and first exciton from its newest
 * finished analysis so that each candidate is checked as the engine will check it.
 */
export async function getRerunParents(spectrumId: string): Promise<{ candidates: ParentCandidate[]; target: ParentTarget } | null> {
  const [s] = await selectRows<{
    id: string;
    project_id: string;
    technique: Technique;
    sample_id: string | null;
    sample_name: string | null;
    material: string | null;
    first_exciton_ev: number | null;
    fwhm_mev: number | null;
    min_ev: number | null;
    max_ev: number | null;
  }>(
    `SELECT s.id, s.project_id, s.technique, s.sample_id, sm.name AS sample_name, sm.material,
            fx.energy_ev AS first_exciton_ev, fx.fwhm_mev, run.min_ev, run.max_ev
       FROM spectra s LEFT JOIN samples sm ON sm.id = s.sample_id
       LEFT JOIN LATERAL (
         SELECT r.id, (r.report #>> '{parameters,grid,minEv}')::float8 AS min_ev, (r.report #>> '{parameters,grid,maxEv}')::float8 AS max_ev
           FROM analysis_runs r WHERE r.spectrum_id = s.id AND r.status = 'done' ORDER BY r.created_at DESC LIMIT 1
       ) run ON true
       LEFT JOIN LATERAL (SELECT p.energy_ev, p.fwhm_mev FROM peaks p WHERE p.run_id = run.id AND p.is_first_exciton LIMIT 1) fx ON true
      WHERE s.id = :spectrumId`,
    { spectrumId },
  );
  if (!s) return null;
  const [candidates, parents] = await Promise.all([
    listParentCandidates([s.project_id]),
    s.sample_id ? parentSampleIds([s.sample_id]) : new Map<string, string[]>(),
  ]);
  return {
    candidates: candidates.get(s.project_id) ?? [],
    target: {
      technique: s.technique,
      spectrumId: s.id,
      sample: s.sample_id
        ? { id: s.sample_id, name: s.sample_name ?? "", material: s.material ?? "", parentIds: parents.get(s.sample_id) ?? [] }
        : null,
      side:
        s.min_ev !== null && s.max_ev !== null
          ? { technique: s.technique, rangeEv: [s.min_ev, s.max_ev], bandEv: s.first_exciton_ev, fwhmMeV: s.fwhm_mev }
          : null,
    },
  };
}
