import { selectRows } from "@/lib/db";
import type { FlagKind } from "@/lib/registry/flagKinds";
import type { Technique } from "@/lib/registry/techniques";
import { AnalysisRun, Peak, Signature, type Spectrum } from "@/models";
import type { ResolvedLink } from "./shareLinks";

// What a read-only share link shows of one spectrum: its latest finished analysis, the fitted
// peaks and the flagged changes with their numbers, never their review state (a guest sees the
// science, not the group's decisions). The caller has already checked that the spectrum is
// within the link (spectrumThroughLink).

export type SharedPeak = { id: string; energyEv: number; wavelengthNm: number; fwhmMeV: number | null; isFirstExciton: boolean };
export type SharedFlag = {
  id: string;
  kind: FlagKind;
  energyEv: number | null;
  magnitude: number | null;
  unit: string | null;
  uncertainty: number | null;
  significance: number;
};
export type SharedSpectrumView = {
  id: string;
  fileName: string;
  technique: Technique;
  status: string;
  /** The finished run shown, or null (not analysed yet, or failed). */
  runId: string | null;
  hasReference: boolean;
  peaks: SharedPeak[];
  flags: SharedFlag[];
};

export async function sharedSpectrumView(spectrum: Spectrum): Promise<SharedSpectrumView> {
  const run = await AnalysisRun.findOne({
    where: { spectrumId: spectrum.id, status: "done" },
    order: [["createdAt", "DESC"]],
    attributes: ["id", "referenceSpectrumId"],
  });
  const [peaks, flags] = run
    ? await Promise.all([
        Peak.findAll({
          where: { runId: run.id },
          order: [["energyEv", "ASC"]],
          attributes: ["id", "energyEv", "wavelengthNm", "fwhmMeV", "isFirstExciton"],
        }),
        // review_state is deliberately not read
        Signature.findAll({
          where: { runId: run.id },
          order: [["significance", "DESC"]],
          attributes: ["id", "kind", "energyEv", "magnitude", "unit", "uncertainty", "significance"],
        }),
      ])
    : [[], []];
  return {
    id: spectrum.id,
    fileName: spectrum.fileName,
    technique: spectrum.technique,
    status: spectrum.status,
    runId: run?.id ?? null,
    hasReference: Boolean(run?.referenceSpectrumId),
    peaks: peaks.map((p) => ({
      id: p.id,
      energyEv: p.energyEv,
      wavelengthNm: p.wavelengthNm,
      fwhmMeV: p.fwhmMeV,
      isFirstExciton: p.isFirstExciton,
    })),
    flags: flags.map((s) => ({
      id: s.id,
      kind: s.kind,
      energyEv: s.energyEv,
      magnitude: s.magnitude,
      unit: s.unit,
      uncertainty: s.uncertainty,
      significance: s.significance,
    })),
  };
}

export type SharedSupernatant = { id: string; fileName: string; status: string; pointFileName: string };

/** The supernatant spectra measured for the points of a shared series (part of those points' measurements). */
export async function sharedSupernatants(link: ResolvedLink): Promise<SharedSupernatant[]> {
  if (link.targetType !== "series") return [];
  const rows = await selectRows<{ id: string; file_name: string; status: string; point_file_name: string }>(
    `SELECT s.id, s.file_name, s.status, p.file_name AS point_file_name FROM spectra s JOIN spectra p ON p.id = s.supernatant_of_spectrum_id
     WHERE p.series_id = :seriesId ORDER BY p.series_value NULLS LAST, p.created_at`,
    { seriesId: link.targetId },
  );
  return rows.map((r) => ({ id: r.id, fileName: r.file_name, status: r.status, pointFileName: r.point_file_name }));
}
