// Server side of the viewer: finds the run to show, re-derives its arrays from the raw file(s) and
// the engine, and caches the results (in-process LRU first, Redis second) by run id and axis. A
// finished run never changes, so its arrays never go stale; the engine version is in the key so a
// new engine re-derives.
import { Op } from "sequelize";
import type { Technique } from "@/lib/registry/techniques";
import { z } from "zod";
import type { Actor } from "@/lib/auth/actor";
import { ENGINE_VERSION, SpectrumFileError } from "@/lib/engine";
import type { AnalysisReport, ParsedSpectrum } from "@/lib/engine/types";
import { notFound } from "@/lib/http/respond";
import { readChoiceOf, type AnalysisParameters } from "@/lib/ingest/parameters";
import type { ReadChoice } from "@/lib/engine";
import { getReadableSpectrum } from "@/lib/queries/spectrum-status";
import { redis } from "@/lib/redis";
import { parsedRawFile, storedReadChoice } from "@/lib/rawSpectra";
import { AnalysisRun, Spectrum } from "@/models";
import { DISPLAY_AXES, type DisplayAxis } from "./axis";
import { deriveViewArrays, type ViewArrays } from "./deriveViewArrays";
import { SizedLru } from "@/lib/lruCache";
import { buildBinaryPayload, buildDataPayload } from "./payload";
import { Refusal } from "@/lib/errors";
import { processSingleton } from "@/lib/processSingleton";

export const viewQuerySchema = z.object({
  axis: z.enum(DISPLAY_AXES, { error: "axis must be nm, ev or cm-1" }).default("nm"),
  run: z.string().uuid("run must be an analysis run id (UUID)").optional(),
});

/** The data endpoint's query: the view query and the body's encoding (JSON, or the binary columns format). */
export const dataQuerySchema = viewQuerySchema.extend({
  format: z.enum(["json", "binary"], { error: "format must be json or binary" }).default("json"),
});
export type DataFormat = z.infer<typeof dataQuerySchema>["format"];

/** Parses the query string, naming the field in the error. */
export function parseViewQuery<S extends z.ZodType>(schema: S, url: string): z.infer<S> {
  const params = Object.fromEntries(new URL(url).searchParams.entries());
  const parsed = schema.safeParse(params);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = issue?.path.map(String).join(".") || undefined;
    throw new Refusal(400, "invalid", `${field ? `${field}: ` : ""}${issue?.message ?? "invalid query"}`, field);
  }
  return parsed.data;
}

export type ViewRun = Pick<AnalysisRun, "id" | "status" | "parameters" | "referenceSpectrumId" | "engineVersion" | "errorMessage">;

/**
 * The spectrum (when the actor may read it; else 404) and the run to show: the one asked for, or
 * the latest finished one. 409 while nothing has finished; 422 with the engine's message when the
 * analysis failed.
 */
// A chart zoomed or reloaded asks for the same curves many times a second: the run found for
// a (spectrum, run) pair is kept for RUN_CACHE_MS, so a burst does not repeat the run lookup.
// The access check is never cached: a revoked share or a removed member is refused at once.
const RUN_CACHE_MS = 2000;
const runCache = new Map<string, { until: number; run: ViewRun }>();

export async function findViewRun(actor: Actor, spectrumId: string, runId?: string): Promise<{ spectrum: Spectrum; run: ViewRun }> {
  const spectrum = await getReadableSpectrum(actor, spectrumId);
  if (!spectrum) throw notFound(`spectrum ${spectrumId.slice(0, 80)}`);
  const key = `${spectrumId}|${runId ?? ""}`;
  const hit = runCache.get(key);
  if (hit && hit.until > Date.now()) return { spectrum, run: hit.run };
  const found = checkedRun(spectrum, await lookupRun(spectrumId, runId), runId);
  if (runCache.size > 5000) runCache.clear();
  runCache.set(key, { until: Date.now() + RUN_CACHE_MS, run: found.run }); // only a finished run gets here
  return found;
}

async function lookupRun(spectrumId: string, runId?: string): Promise<ViewRun | null> {
  const attributes = ["id", "status", "parameters", "referenceSpectrumId", "engineVersion", "errorMessage"];
  return runId
    ? await AnalysisRun.findOne({ where: { id: runId, spectrumId }, attributes })
    : ((await AnalysisRun.findOne({ where: { spectrumId, status: "done" }, order: [["createdAt", "DESC"]], attributes })) ??
        (await AnalysisRun.findOne({ where: { spectrumId, status: { [Op.ne]: "done" } }, order: [["createdAt", "DESC"]], attributes })));
}

function checkedRun(spectrum: Spectrum, run: ViewRun | null, runId?: string): { spectrum: Spectrum; run: ViewRun } {
  if (!run) {
    if (runId) throw new Refusal(404, "not-found", `run ${runId} of this spectrum was not found.`, "run");
    if (spectrum.status === "failed") throw new Refusal(422, "analysis-failed", spectrum.errorMessage ?? "the file could not be read");
    throw new Refusal(409, "not-ready", "this spectrum has not been analysed yet; try again when its analysis has finished.");
  }
  if (run.status === "failed")
    throw new Refusal(422, "analysis-failed", run.errorMessage ?? spectrum.errorMessage ?? "the analysis failed");
  if (run.status !== "done") throw new Refusal(409, "not-ready", `the analysis is ${run.status}; try again when it has finished.`);
  return { spectrum, run };
}

export async function getRunReport(runId: string): Promise<AnalysisReport> {
  const row = await AnalysisRun.findByPk(runId, { attributes: ["id", "report"] });
  if (!row?.report) throw new Refusal(409, "not-ready", "this analysis run has no stored report.");
  return row.report as AnalysisReport;
}

/** A stored raw file, parsed (from lib/rawSpectra's cache); an unreadable one is a 422. */
function parsedStored(spectrum: Spectrum, choice: ReadChoice): Promise<ParsedSpectrum> {
  return parsedRawFile(spectrum, choice, async (parse) => {
    try {
      return await parse();
    } catch (error) {
      if (error instanceof SpectrumFileError) throw new Refusal(422, "unreadable", error.message);
      throw error;
    }
  });
}

type ViewEntry = { arrays: ViewArrays; technique: Technique; yUnit: string };
const MB = 1024 * 1024;
const arraysCache = processSingleton(
  "bandkeepViewArrays",
  () => new SizedLru<ViewEntry>(64 * MB, (v) => v.arrays.energyEv.length * 8 * 5 + 256),
);
const payloadCache = processSingleton("bandkeepViewPayloads", () => new SizedLru<Buffer>(96 * MB, (b) => b.length));
const inflight = processSingleton("bandkeepViewInflight", () => new Map<string, Promise<ViewEntry>>());
const REDIS_TTL_S = 7 * 24 * 3600;

const arraysKey = (runId: string) => `${ENGINE_VERSION}:${runId}`;
const payloadKey = (runId: string, axis: DisplayAxis, format: DataFormat) =>
  format === "json"
    ? `bandkeep:view:v1:${ENGINE_VERSION}:${runId}:${axis}`
    : `bandkeep:view:v1:${ENGINE_VERSION}:${runId}:${axis}:${format}`;

/** Re-derives (or takes from the in-process cache) the arrays of a finished run. Concurrent callers share one derivation. */
export async function viewArraysOf(spectrum: Spectrum, run: ViewRun): Promise<{ arrays: ViewArrays; technique: Technique; yUnit: string }> {
  const key = arraysKey(run.id);
  const hit = arraysCache.get(key);
  if (hit) return hit;
  let pending = inflight.get(key);
  if (!pending) {
    pending = (async () => {
      const report = await getRunReport(run.id);
      const params = (run.parameters ?? {}) as AnalysisParameters;
      const reference = run.referenceSpectrumId ? await Spectrum.findByPk(run.referenceSpectrumId) : null;
      if (run.referenceSpectrumId && !reference)
        throw new Refusal(409, "reference-missing", "the parent reference of this analysis was deleted.");
      const [sample, parsedRef] = await Promise.all([
        parsedStored(spectrum, readChoiceOf(params)),
        reference ? parsedStored(reference, storedReadChoice(reference)) : Promise.resolve(null),
      ]);
      let arrays: ViewArrays;
      try {
        arrays = deriveViewArrays(report, sample, parsedRef);
      } catch (error) {
        if (error instanceof RangeError) throw new Refusal(422, "unreadable", `${spectrum.fileName}: ${error.message}`);
        throw error;
      }
      const value = { arrays, technique: report.technique, yUnit: sample.yUnit };
      arraysCache.set(key, value);
      return value;
    })().finally(() => inflight.delete(key));
    inflight.set(key, pending);
  }
  return pending;
}

export type CacheOutcome = "memory" | "redis" | "derived";

/** The data endpoint's body for one run, axis and format, from the caches when possible. */
export async function dataPayload(
  spectrum: Spectrum,
  run: ViewRun,
  axis: DisplayAxis,
  format: DataFormat = "json",
): Promise<{ body: Buffer; cache: CacheOutcome }> {
  const key = payloadKey(run.id, axis, format);
  const hit = payloadCache.get(key);
  if (hit) return { body: hit, cache: "memory" };
  try {
    const stored = await redis().getBuffer(key);
    if (stored) {
      payloadCache.set(key, stored);
      return { body: stored, cache: "redis" };
    }
  } catch {
    // Redis down: derive instead; the in-process cache still works.
  }
  const { arrays, technique, yUnit } = await viewArraysOf(spectrum, run);
  const meta = { spectrumId: spectrum.id, runId: run.id, technique, yUnit };
  const body =
    format === "binary" ? Buffer.from(buildBinaryPayload(arrays, axis, meta)) : Buffer.from(buildDataPayload(arrays, axis, meta), "utf8");
  payloadCache.set(key, body);
  redis()
    .set(key, body, "EX", REDIS_TTL_S)
    .catch(() => {});
  return { body, cache: "derived" };
}
