// Our own marker colours: flags by kind (from the flag-kind registry), peaks in a quiet ink.
export { FLAG_COLOURS } from "@/lib/registry/flagKinds";
export const PEAK_COLOUR = "#8a93a3";

export const SERIES_STYLE = {
  raw: { label: "measured", stroke: "#b8b2ac", width: 1 },
  smoothed: { label: "smoothed", stroke: "#1d2430", width: 1.6 },
  reference: { label: "parent reference", stroke: "#3b6ea8", width: 1.6, dash: [7, 4] },
  difference: { label: "difference (right axis)", stroke: "#d9622b", width: 1.4 },
} as const;
