import { UnrecoverableError, type Job } from "bullmq";
import { z } from "zod";

import { getObjectBytes } from "@/lib/storage";
import type { AnalysisJob } from "@/lib/queue";
import { ENGINE_VERSION, SpectrumFileError, analyzeSpectrum, type AnalysisOptions, type ParsedSpectrum } from "@/lib/engine";
import { readChoiceOf } from "@/lib/ingest/parameters";
import { parseRawBytes, parsedRawFile, storedReadChoice } from "@/lib/rawSpectra";
import { loadRun, markRunning, type RunToAnalyse } from "./loadRun";
import { saveAnalysis, saveFailure } from "./saveAnalysis";

const payloadSchema = z.object({ spectrumId: z.string().uuid(), runId: z.string().uuid() }).strict();

export type JobSummary = {
  runId: string;
  outcome: "done" | "already-done" | "already-failed" | "failed";
  peaks?: number;
  flags?: number;
  message?: string;
};

/** A fault of the data (or of the engine on this data): retrying cannot help. */
class DataFault extends Error {}

function engineStep<T>(fileName: string, step: () => T): T {
  try {
    return step();
  } catch (error) {
    throw asDataFault(fileName, error);
  }
}

async function engineStepAsync<T>(fileName: string, step: () => Promise<T>): Promise<T> {
  try {
    return await step();
  } catch (error) {
    throw asDataFault(fileName, error);
  }
}

function asDataFault(fileName: string, error: unknown): DataFault {
  if (error instanceof SpectrumFileError) return new DataFault(error.message);
  if (error instanceof RangeError || error instanceof TypeError) return new DataFault(`${fileName}: ${error.message}`);
  console.error(JSON.stringify({ level: "error", msg: "engine error", fileName, error: String(error) }));
  return new DataFault(`${fileName}: the analysis stopped on an internal error; the raw file is kept`);
}

async function loadReference(run: RunToAnalyse): Promise<ParsedSpectrum | undefined> {
  if (!run.referenceSpectrumId) return undefined;
  const reference = run.reference;
  if (!reference) throw new DataFault(`${run.spectrum.fileName}: its reference spectrum was deleted`);
  try {
    return await parsedRawFile(reference, storedReadChoice(reference), (parse) => engineStepAsync(reference.fileName, parse));
  } catch (error) {
    if (error instanceof DataFault) throw new DataFault(`reference spectrum ${error.message}`);
    throw error;
  }
}

/**
 * Analyses one run: loads it by id (with its spectrum and reference, one query), fetches the
 * raw file (the reference's comes parsed from lib/rawSpectra's cache), parses, analyses
 * and saves everything in one statement. Unreadable files fail the run with the engine's
 * message and are not retried; service faults are thrown for a retry with backoff.
 */
export async function processAnalysis(job: Job<AnalysisJob>): Promise<JobSummary> {
  const payload = payloadSchema.safeParse(job.data);
  if (!payload.success) throw new UnrecoverableError(`job ${job.id}: payload is not {spectrumId, runId}`);
  const { spectrumId, runId } = payload.data;
  const run = await loadRun(runId);
  if (!run || run.spectrumId !== spectrumId)
    throw new UnrecoverableError(`job ${job.id}: run ${runId} of spectrum ${spectrumId} does not exist`);
  if (run.status === "done") return { runId, outcome: "already-done" };
  if (run.status === "failed") return { runId, outcome: "already-failed" };
  const spectrum = run.spectrum;

  const startedAt = new Date();
  const t0 = performance.now();
  try {
    await markRunning(runId, spectrumId, startedAt);
    const parameters = run.parameters ?? { technique: spectrum.technique };
    const bytes = await getObjectBytes(spectrum.objectKey);
    const parsed = await engineStepAsync(spectrum.fileName, () => parseRawBytes(spectrum, bytes, readChoiceOf(parameters)));
    const parsedReference = await loadReference(run);
    await job.updateProgress({ stage: "analysing" });

    const options: AnalysisOptions & { reference?: ParsedSpectrum } = { technique: parameters.technique };
    if (parsedReference) options.reference = parsedReference;
    if (parameters.material) options.material = parameters.material;
    const pathLengthCm = parameters.pathLengthCm ?? parsed.pathLengthCm;
    if (pathLengthCm !== undefined) options.pathLengthCm = pathLengthCm;
    const excitationNm = parameters.excitationNm ?? parsed.excitationNm;
    if (excitationNm !== undefined) options.excitationNm = excitationNm;
    if (parameters.smoothingWindow !== undefined) options.smoothingWindow = parameters.smoothingWindow;
    if (parameters.smoothingPolynomial !== undefined) options.smoothingPolynomial = parameters.smoothingPolynomial;
    if (parameters.baseline !== undefined) options.baseline = parameters.baseline;
    if (parameters.thresholds !== undefined) options.thresholds = parameters.thresholds;
    if (parameters.normalization !== undefined) options.normalization = parameters.normalization;
    const report = engineStep(spectrum.fileName, () => analyzeSpectrum(parsed, options));

    const wrote = await saveAnalysis({
      runId,
      report,
      startedAt,
      durationMs: performance.now() - t0,
      engineVersion: ENGINE_VERSION,
      axisUnit: parsed.xUnit,
      valueUnit: parsed.yUnit,
    });
    return { runId, outcome: wrote ? "done" : "already-done", peaks: report.peaks.length, flags: report.flags.length };
  } catch (error) {
    if (error instanceof DataFault) {
      await saveFailure(runId, error.message, performance.now() - t0);
      return { runId, outcome: "failed", message: error.message };
    }
    const attempts = job.opts.attempts ?? 1;
    if (job.attemptsMade + 1 >= attempts) {
      await saveFailure(
        runId,
        `${spectrum.fileName}: the analysis could not finish after ${attempts} attempts (storage or database unreachable); the raw file is kept, re-run the analysis later`,
      ).catch(() => {});
    }
    throw error;
  }
}
