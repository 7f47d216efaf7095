import { TECHNIQUE_SPECS, type Technique } from "@/lib/registry/techniques";
import type { AnalysisReport } from "@/lib/engine/types";
import { toDisplayAxis, type DisplayAxis } from "./axis";
import type { ViewArrays } from "./deriveViewArrays";
import { yLabelFor, type SeriesKey } from "./payload";
import { writeCsv } from "./writeCsv";
import { writeJcamp } from "@/lib/formats/jcamp";
import { resampleLinear } from "./resampleLinear";
import { Refusal } from "@/lib/errors";

type SpectrumRef = { id: string; fileName: string; technique: Technique };
type View = { arrays: ViewArrays; technique: Technique; yUnit: string };

export type ExportRequest =
  | { format: "json"; spectrum: SpectrumRef; runId: string; report: AnalysisReport }
  | {
      format: "csv" | "jcamp";
      spectrum: SpectrumRef;
      runId: string;
      report: AnalysisReport;
      axis: DisplayAxis;
      series: SeriesKey;
      view: View;
    };

export type ExportedFile = { body: string; contentType: string; disposition: string; fileName: string };

const SERIES_TITLES: Record<SeriesKey, string> = {
  raw: "measured",
  smoothed: "smoothed",
  reference: "reference",
  difference: "difference",
};
const JCAMP_X_UNITS: Record<DisplayAxis, string> = { nm: "NANOMETERS", ev: "EV", "cm-1": "1/CM" };

function disposition(fileName: string): string {
  const ascii = fileName.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}

const baseName = (fileName: string) => (fileName.split("/").pop() || "spectrum").replace(/\.[A-Za-z0-9]{1,6}$/, "") || "spectrum";

/** Builds one download: the stored report (JSON), all processed curves (CSV) or one curve (JCAMP-DX). */
export function exportFile(req: ExportRequest): ExportedFile {
  const base = baseName(req.spectrum.fileName);
  if (req.format === "json") {
    const fileName = `${base}.analysis-${req.runId.slice(0, 8)}.json`;
    return {
      body: JSON.stringify(req.report, null, 2),
      contentType: "application/json; charset=utf-8",
      disposition: disposition(fileName),
      fileName,
    };
  }
  const { arrays, technique, yUnit } = req.view;
  const yLabel = yLabelFor(technique, yUnit, arrays.emission, req.axis);
  const valueWord = arrays.emission ? "counts" : TECHNIQUE_SPECS[technique].valueWord;
  const d = toDisplayAxis(
    arrays.energyEv,
    { raw: arrays.raw, smoothed: arrays.smoothed, reference: arrays.reference, difference: arrays.difference },
    req.axis,
    {
      emission: arrays.emission,
    },
  );
  if (req.format === "csv") {
    const fileName = `${base}.processed-${req.axis}.csv`;
    const body = writeCsv(d, {
      metadata: {
        spectrum: req.spectrum.fileName,
        "analysis run": req.runId,
        engine: `Bandkeep engine ${req.report.engineVersion}`,
        technique,
        values: yLabel,
      },
      columnNames: Object.fromEntries(Object.entries(SERIES_TITLES).map(([k, t]) => [k, `${valueWord} ${t}`])),
    });
    return { body, contentType: "text/csv; charset=utf-8", disposition: disposition(fileName), fileName };
  }
  const y = d.series[req.series];
  if (!y) throw new Refusal(400, "invalid", `series: this analysis has no parent reference, so there is no ${req.series} curve`, "series");
  const uniform = req.axis === "nm" ? resampleLinear(d.x, y) : { x: d.x, y };
  const fileName = `${base}.${req.series}-${req.axis}.jdx`;
  const body = writeJcamp({
    title: `${req.spectrum.fileName} (${SERIES_TITLES[req.series]})`,
    dataType: TECHNIQUE_SPECS[technique].jcampDataType,
    xUnits: JCAMP_X_UNITS[req.axis],
    yUnits: valueWord === "counts" ? "ARBITRARY UNITS" : "ABSORBANCE",
    x: uniform.x,
    y: uniform.y,
    origin: "Bandkeep",
    owner: "",
    labels: { "BANDKEEP RUN": req.runId, "BANDKEEP ENGINE": req.report.engineVersion, "BANDKEEP TECHNIQUE": technique },
    comments: [
      `${SERIES_TITLES[req.series]} curve of analysis run ${req.runId}; values: ${yLabel}`,
      ...(req.axis === "nm"
        ? ["the analysis grid is uniform in energy: values were interpolated linearly onto equal wavelength steps"]
        : []),
    ],
  });
  return { body, contentType: "chemical/x-jcamp-dx; charset=utf-8", disposition: disposition(fileName), fileName };
}
