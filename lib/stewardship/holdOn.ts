import type { ActiveHold, RetainedItem } from "./types";

/**
 * The first active hold that covers an item, or undefined. A hold on a project, series,
 * sample or spectrum covers every spectrum within it and every analysis of those spectra.
 */
export function holdOn(
  item: Pick<RetainedItem, "projectId" | "seriesId" | "sampleId" | "spectrumId">,
  holds: readonly ActiveHold[],
): ActiveHold | undefined {
  return holds.find(
    (h) =>
      (h.targetType === "project" && h.targetId === item.projectId) ||
      (h.targetType === "series" && item.seriesId !== null && h.targetId === item.seriesId) ||
      (h.targetType === "sample" && item.sampleId !== null && h.targetId === item.sampleId) ||
      (h.targetType === "spectrum" && h.targetId === item.spectrumId),
  );
}
