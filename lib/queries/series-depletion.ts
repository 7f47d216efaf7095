import type { Actor } from "@/lib/auth/actor";
import { canReadProject } from "@/lib/auth/access";
import { selectRows } from "@/lib/db";
import { isMaterialName } from "@/lib/engine/derived/materials";
import type { MaterialName } from "@/lib/engine/types";
import { materialFromText } from "@/lib/ingest/parameters";
import { Project } from "@/models";
import type { SeriesDetail } from "./series-detail";

export type PureCandidate = {
  spectrumId: string;
  fileName: string;
  sampleName: string | null;
  /** The engine material of the upload, else guessed from the sample's material text; null when neither names one. */
  material: MaterialName | null;
  /** First exciton of the latest finished analysis, nm. */
  firstExcitonNm: number | null;
};

export type DepletionSetupView = {
  /** The series' points with the supernatant linked to each, if any. */
  links: {
    pointSpectrumId: string;
    pointFileName: string;
    value: number | null;
    supernatant: { spectrumId: string; fileName: string } | null;
  }[];
  /** Absorption spectra of the project that could be linked as supernatants (empty unless the actor may add data). */
  linkable: { spectrumId: string; fileName: string; createdAt: string }[];
  /** Absorption spectra the actor may read, to serve as spectra of the pure dots. */
  pureCandidates: PureCandidate[];
  /** The points' common parent reference (pure A in a titration of A), and the one candidate of another material. */
  defaults: { pureA: string | null; pureX: string | null };
};

const LIMIT = 200;

/**
 * What the depletion panel of a titration needs at render: links, candidate supernatants and pure
 * spectra. The series was already checked readable by getSeriesDetail; spectra outside the series
 * are offered only to people who read the whole project (collaborators with a series share get its
 * points only).
 */
export async function getDepletionSetup(actor: Actor, series: SeriesDetail, projectId: string): Promise<DepletionSetupView> {
  const project = await Project.findByPk(projectId);
  const readsProject = project ? await canReadProject(actor, project) : false;
  const [linked, candidates, linkable, references] = await Promise.all([
    selectRows<{ point_id: string; id: string; file_name: string }>(
      `SELECT p.id AS point_id, s.id, s.file_name FROM spectra p JOIN spectra s ON s.supernatant_of_spectrum_id = p.id WHERE p.series_id = :id`,
      { id: series.id },
    ),
    selectRows<{
      id: string;
      file_name: string;
      sample_name: string | null;
      sample_material: string | null;
      material: string | null;
      first_exciton_nm: number | null;
    }>(
      `SELECT s.id, s.file_name, sa.name AS sample_name, sa.material AS sample_material, s.material,
         (SELECT (r.report->'firstExciton'->>'wavelengthNm')::double precision FROM analysis_runs r
          WHERE r.spectrum_id = s.id AND r.status = 'done' ORDER BY r.created_at DESC LIMIT 1) AS first_exciton_nm
       FROM spectra s LEFT JOIN samples sa ON sa.id = s.sample_id
       WHERE s.technique = 'absorption' AND s.supernatant_of_spectrum_id IS NULL
         AND ${readsProject ? "s.project_id = :projectId" : "s.series_id = :seriesId"}
       ORDER BY s.created_at DESC LIMIT ${LIMIT}`,
      { projectId, seriesId: series.id },
    ),
    series.mayWrite
      ? selectRows<{ id: string; file_name: string; created_at: Date }>(
          `SELECT s.id, s.file_name, s.created_at FROM spectra s
           WHERE s.project_id = :projectId AND s.technique = 'absorption' AND s.series_id IS NULL AND s.supernatant_of_spectrum_id IS NULL
           ORDER BY s.created_at DESC LIMIT ${LIMIT}`,
          { projectId },
        )
      : Promise.resolve([]),
    selectRows<{ reference_spectrum_id: string | null }>(`SELECT DISTINCT reference_spectrum_id FROM spectra WHERE series_id = :id`, {
      id: series.id,
    }),
  ]);
  const supernatantOf = new Map(linked.map((l) => [l.point_id, { spectrumId: l.id, fileName: l.file_name }]));
  const pureCandidates: PureCandidate[] = candidates.map((c) => {
    const named = c.material && isMaterialName(c.material) ? c.material : (materialFromText(c.sample_material) ?? null);
    return { spectrumId: c.id, fileName: c.file_name, sampleName: c.sample_name, material: named, firstExcitonNm: c.first_exciton_nm };
  });
  const referenceIds = references.map((r) => r.reference_spectrum_id);
  const common = referenceIds.length === 1 ? referenceIds[0]! : null;
  const pureA = common && pureCandidates.some((c) => c.spectrumId === common) ? common : null;
  const materialA = pureCandidates.find((c) => c.spectrumId === pureA)?.material ?? null;
  const others = materialA ? pureCandidates.filter((c) => c.material !== null && c.material !== materialA) : [];
  return {
    links: series.points.map((p) => ({
      pointSpectrumId: p.spectrumId,
      pointFileName: p.fileName,
      value: p.value,
      supernatant: supernatantOf.get(p.spectrumId) ?? null,
    })),
    linkable: linkable.map((l) => ({ spectrumId: l.id, fileName: l.file_name, createdAt: new Date(l.created_at).toISOString() })),
    pureCandidates,
    defaults: { pureA, pureX: others.length === 1 ? others[0]!.spectrumId : null },
  };
}
