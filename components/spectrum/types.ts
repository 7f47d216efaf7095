import type { SpectrumDetail } from "@/lib/queries/spectrum-detail";

export type PeakRow = SpectrumDetail["peaks"][number];
export type FlagRow = SpectrumDetail["signatures"][number];

/** A vertical marker on the chart, tied to one row of the peaks or flags table. */
export type Marker = { id: string; group: "peak" | "flag"; kind: string; energyEv: number; label: string };
