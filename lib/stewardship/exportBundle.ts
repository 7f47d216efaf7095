import { sha256Hex } from "@/lib/hash";
import { writeCsvTable } from "@/lib/formats/csv";
import { jcampUnits, writeJcamp } from "@/lib/formats/jcamp";
import { strToU8, Zip, ZipDeflate } from "fflate";
import { Op } from "sequelize";
import { selectRows } from "@/lib/db";
import { ENGINE_VERSION, type ParsedSpectrum } from "@/lib/engine";
import { hazardsOf } from "@/lib/hazards";
import { parseRawBytes, storedRawBytes, storedReadChoice } from "@/lib/rawSpectra";
import { AnalysisRun, Group, Project, Sample, Series, Spectrum } from "@/models";
import { TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import { countOf } from "@/lib/format/quantity";

// One zip per series or project: raw files as they arrived, processed data as CSV and
// JCAMP-DX, analyses as JSON, a manifest with the sha256 of every other file, and a README.

export const BUNDLE_FORMAT = "bandkeep-bundle/1";

export type ManifestFile = {
  path: string;
  sha256: string;
  bytes: number;
  kind: "raw" | "processed-csv" | "processed-jcamp" | "analysis" | "readme";
};
export type Manifest = {
  format: typeof BUNDLE_FORMAT;
  createdAt: string;
  createdBy: string;
  engineVersion: string;
  target: { type: "project" | "series"; id: string; name: string };
  group: string;
  project: { id: string; name: string; description: string };
  series: { id: string; name: string; kind: string; variableName: string; variableUnit: string }[];
  samples: {
    id: string;
    name: string;
    material: string;
    coreShell: string;
    ligand: string;
    solvent: string;
    hazardClass: string;
    cautions: string[];
  }[];
  spectra: {
    id: string;
    fileName: string;
    sha256: string;
    sizeBytes: number;
    technique: string;
    status: string;
    sampleId: string | null;
    seriesId: string | null;
    seriesValue: number | null;
    supernatantOfSpectrumId: string | null;
    referenceSpectrumId: string | null;
    pathLengthCm: number | null;
    excitationNm: number | null;
    solvent: string;
    uploadedAt: string;
    files: string[];
    note?: string;
  }[];
  files: ManifestFile[];
};

const safeName = (s: string) => s.replace(/[^A-Za-z0-9._-]+/g, "_").slice(0, 80) || "file";

function processedCsv(p: ParsedSpectrum): string {
  return writeCsvTable({ header: [`x_${p.xUnit}`, `y_${p.yUnit}`], columns: [p.x, p.y] });
}

function processedJcamp(s: Spectrum, p: ParsedSpectrum, groupName: string | undefined): string {
  const units = jcampUnits(p.xUnit, p.yUnit);
  return writeJcamp({
    title: s.fileName,
    dataType: TECHNIQUE_SPECS[s.technique].jcampDataType,
    xUnits: units.xUnits,
    yUnits: units.yUnits,
    x: p.x,
    y: units.yScale === 1 ? p.y : Float64Array.from(p.y, (v) => v * units.yScale),
    origin: groupName ?? "Bandkeep",
    owner: groupName ?? "",
    labels: { "BANDKEEP SPECTRUM": s.id, "SOURCE SHA256": s.sha256 },
  });
}

function readme(m: Omit<Manifest, "files">, hazardLines: string[]): string {
  return [
    `Bandkeep export bundle — ${m.target.type} "${m.target.name}"`,
    "",
    `Made ${m.createdAt} by ${m.createdBy}, group ${m.group}, project "${m.project.name}".`,
    `${countOf(m.spectra.length, "spectrum")} in ${countOf(m.series.length, "series")}. Format ${BUNDLE_FORMAT}; analysis engine ${m.engineVersion}.`,
    "",
    "What is inside",
    "  raw/         each file exactly as it was uploaded (its sha256 is the one recorded at upload)",
    "  processed/   the parsed spectrum of each file, as CSV (x,y in the file's own units, x ascending)",
    "               and as JCAMP-DX 4.24 (AFFN; equal steps as XYDATA, others as a PEAK TABLE); percent transmittance is written as a fraction there",
    "  analyses/    each analysis run as JSON: parameters, noise, peaks, flagged changes, derived values",
    "  manifest.json  the project, series, samples and spectra metadata, and the sha256 and size of",
    "               every file in this bundle except manifest.json itself",
    "",
    'Checking the bundle: compute the sha256 of each file and compare it with manifest.json "files".',
    "A spectrum whose file could not be read has its raw file only; its manifest entry says why.",
    "",
    ...(hazardLines.length
      ? [
          "Safety",
          ...hazardLines.map((l) => `  ${l}`),
          "  Follow your institution's chemical hygiene plan, local regulations and licensed practice.",
          "",
        ]
      : []),
    "The numbers support, and do not replace, a scientist's judgement.",
    "",
  ].join("\n");
}

/** Spectra read from the database per batch while the bundle is written. */
const BATCH = 100;

export type BundleStream = {
  fileName: string;
  /** The zip, produced as it is read: one spectrum's files at a time (bounded memory). */
  chunks: AsyncGenerator<Uint8Array>;
  /** The manifest and byte count, once the last chunk has been read. */
  done: Promise<{ manifest: Manifest; bytes: number }>;
};

/**
 * The bundle of a project or a series, written as it is read: spectrum ids in bundle order are
 * read first (ids only), then the spectra and their runs in batches of BATCH, and each file is
 * compressed into the zip and handed on before the next raw file is fetched. What stays in memory
 * is one raw file and its processed forms, and the manifest's metadata (a few hundred bytes per
 * spectrum). The caller has checked read access.
 */
export async function streamBundle(target: { type: "project" | "series"; id: string }, createdBy: string): Promise<BundleStream> {
  let project: Project | null;
  let seriesList: Series[];
  let spectrumIds: string[];
  let targetName: string;
  if (target.type === "series") {
    const series = await Series.findByPk(target.id);
    if (!series) throw new Error("series not found");
    project = await Project.findByPk(series.projectId);
    seriesList = [series];
    targetName = series.name;
    // the points by their variable, then the supernatant spectra of the points, which travel with the series
    spectrumIds = (
      await selectRows<{ id: string }>(
        `(SELECT id, 0 AS part, series_value, created_at FROM spectra WHERE series_id = :id)
       UNION ALL
       (SELECT x.id, 1, NULL, x.created_at FROM spectra x JOIN spectra pt ON pt.id = x.supernatant_of_spectrum_id WHERE pt.series_id = :id)
       ORDER BY part, series_value ASC NULLS LAST, created_at ASC, id`,
        { id: series.id },
      )
    ).map((r) => r.id);
  } else {
    project = await Project.findByPk(target.id);
    seriesList = project ? await Series.findAll({ where: { projectId: project.id }, order: [["name", "ASC"]] }) : [];
    targetName = project?.name ?? "";
    spectrumIds = project
      ? (
          await selectRows<{ id: string }>("SELECT id FROM spectra WHERE project_id = :id ORDER BY created_at ASC, id", { id: project.id })
        ).map((r) => r.id)
      : [];
  }
  if (!project) throw new Error("project not found");
  const group = await Group.findByPk(project.groupId);
  const samples = spectrumIds.length
    ? await Sample.findAll({
        where: {
          id: {
            [Op.in]: (
              await selectRows<{ id: string }>(
                "SELECT DISTINCT sample_id AS id FROM spectra WHERE id IN (:ids) AND sample_id IS NOT NULL",
                { ids: spectrumIds },
              )
            ).map((r) => r.id),
          },
        },
        order: [["name", "ASC"]],
      })
    : [];
  const theProject = project;
  const fileName = `bandkeep-${target.type}-${safeName(targetName).toLowerCase()}.zip`;

  let finish: (value: { manifest: Manifest; bytes: number }) => void = () => {};
  let fail: (error: unknown) => void = () => {};
  const done = new Promise<{ manifest: Manifest; bytes: number }>((resolve, reject) => {
    finish = resolve;
    fail = reject;
  });
  done.catch(() => {}); // a caller that only reads the chunks sees the error there

  async function* chunks(): AsyncGenerator<Uint8Array> {
    const out: Uint8Array[] = [];
    let written = 0;
    let zipError: unknown = null;
    const zip = new Zip((error, data) => {
      if (error) zipError = error;
      else {
        out.push(data);
        written += data.length;
      }
    });
    const mtime = new Date();
    const listed: ManifestFile[] = [];
    const put = (path: string, bytes: Uint8Array) => {
      const file = new ZipDeflate(path, { level: 6 });
      file.mtime = mtime;
      zip.add(file);
      file.push(bytes, true);
      if (zipError) throw zipError;
    };
    const add = (path: string, bytes: Uint8Array, kind: ManifestFile["kind"]) => {
      put(path, bytes);
      listed.push({ path, sha256: sha256Hex(bytes), bytes: bytes.length, kind });
    };
    const drain = function* () {
      while (out.length) yield out.shift()!;
    };
    try {
      const spectraOut: Manifest["spectra"] = [];
      for (let i = 0; i < spectrumIds.length; i += BATCH) {
        const ids = spectrumIds.slice(i, i + BATCH);
        const rows = await Spectrum.findAll({ where: { id: { [Op.in]: ids } } });
        const byId = new Map(rows.map((r) => [r.id, r]));
        const runs = await AnalysisRun.findAll({ where: { spectrumId: { [Op.in]: ids }, status: "done" }, order: [["createdAt", "ASC"]] });
        for (const id of ids) {
          const s = byId.get(id);
          if (!s) continue; // deleted since the ids were read
          spectraOut.push(
            await addSpectrum(
              s,
              runs.filter((r) => r.spectrumId === id),
              add,
              group?.name ?? "",
            ),
          );
          yield* drain();
        }
      }
      const hazardLines = new Set<string>();
      const samplesOut = samples.map((x) => {
        const flags = hazardsOf({ material: x.material, coreShell: x.coreShell, ligand: x.ligand, solvent: x.solvent });
        flags.forEach((f) => hazardLines.add(`${x.name}: ${f.caution} Source: ${f.source}.`));
        return {
          id: x.id,
          name: x.name,
          material: x.material,
          coreShell: x.coreShell,
          ligand: x.ligand,
          solvent: x.solvent,
          hazardClass: x.hazardClass,
          cautions: flags.map((f) => f.caution),
        };
      });
      const head: Omit<Manifest, "files"> = {
        format: BUNDLE_FORMAT,
        createdAt: new Date().toISOString(),
        createdBy,
        engineVersion: ENGINE_VERSION,
        target: { type: target.type, id: target.id, name: targetName },
        group: group?.name ?? "",
        project: { id: theProject.id, name: theProject.name, description: theProject.description },
        series: seriesList.map((x) => ({
          id: x.id,
          name: x.name,
          kind: x.kind,
          variableName: x.variableName,
          variableUnit: x.variableUnit,
        })),
        samples: samplesOut,
        spectra: spectraOut,
      };
      add("README.txt", strToU8(readme(head, [...hazardLines])), "readme");
      const manifest: Manifest = { ...head, files: listed };
      put("manifest.json", strToU8(JSON.stringify(manifest, null, 2)));
      zip.end();
      if (zipError) throw zipError;
      yield* drain();
      finish({ manifest, bytes: written });
    } catch (error) {
      zip.terminate();
      fail(error);
      throw error;
    }
  }
  return { fileName, chunks: chunks(), done };
}

/** One spectrum's raw file, processed forms and analyses, added to the zip; its manifest entry. */
async function addSpectrum(
  s: Spectrum,
  runs: AnalysisRun[],
  add: (path: string, bytes: Uint8Array, kind: ManifestFile["kind"]) => void,
  groupName: string,
): Promise<Manifest["spectra"][number]> {
  const base = `${s.id.slice(0, 8)}-${safeName(s.fileName.replace(/\.[^.]+$/, ""))}`;
  const own: string[] = [];
  const raw = await storedRawBytes(s);
  const rawPath = `raw/${s.id.slice(0, 8)}-${safeName(s.fileName)}`;
  add(rawPath, raw, "raw");
  own.push(rawPath);
  let note: string | undefined;
  try {
    const parsed = await parseRawBytes(s, raw, storedReadChoice(s));
    add(`processed/${base}.csv`, strToU8(processedCsv(parsed)), "processed-csv");
    add(`processed/${base}.jdx`, strToU8(processedJcamp(s, parsed, groupName || undefined)), "processed-jcamp");
    own.push(`processed/${base}.csv`, `processed/${base}.jdx`);
  } catch (error) {
    note = `not processed: ${error instanceof Error ? error.message.split("\n")[0] : "unreadable file"}`;
  }
  for (const r of runs) {
    const path = `analyses/${base}/${r.id.slice(0, 8)}.json`;
    const json = JSON.stringify(
      {
        runId: r.id,
        spectrumId: s.id,
        engineVersion: r.engineVersion,
        parameterHash: r.parameterHash,
        parameters: r.parameters,
        referenceSpectrumId: r.referenceSpectrumId,
        startedAt: r.startedAt,
        finishedAt: r.finishedAt,
        report: r.report,
      },
      null,
      2,
    );
    add(path, strToU8(json), "analysis");
    own.push(path);
  }
  return {
    id: s.id,
    fileName: s.fileName,
    sha256: s.sha256,
    sizeBytes: s.sizeBytes,
    technique: s.technique,
    status: s.status,
    sampleId: s.sampleId,
    seriesId: s.seriesId,
    seriesValue: s.seriesValue,
    supernatantOfSpectrumId: s.supernatantOfSpectrumId,
    referenceSpectrumId: s.referenceSpectrumId,
    pathLengthCm: s.pathLengthCm,
    excitationNm: s.excitationNm,
    solvent: s.solvent,
    uploadedAt: s.createdAt.toISOString(),
    files: own,
    ...(note ? { note } : {}),
  };
}

/** The whole bundle in memory (tests and small series); the download streams with streamBundle. */
export async function buildBundle(
  target: { type: "project" | "series"; id: string },
  createdBy: string,
): Promise<{ fileName: string; bytes: Uint8Array; manifest: Manifest }> {
  const bundle = await streamBundle(target, createdBy);
  const parts: Uint8Array[] = [];
  for await (const chunk of bundle.chunks) parts.push(chunk);
  const { manifest, bytes } = await bundle.done;
  const all = new Uint8Array(bytes);
  let at = 0;
  for (const part of parts) {
    all.set(part, at);
    at += part.length;
  }
  return { fileName: bundle.fileName, bytes: all, manifest };
}
