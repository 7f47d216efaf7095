import type { SpectrumDetail } from "@/lib/queries/spectrum-detail";
import type { FlagKind } from "@/lib/registry/flagKinds";

export type PeakRow = SpectrumDetail["peaks"][number];
export type FlagRow = SpectrumDetail["signatures"][number];

/** A vertical marker on the chart, tied to one row of the peaks or flags table. */
export type Marker = { id: string; group: "peak" | "flag"; kind: FlagKind | "first-exciton" | "peak"; energyEv: number; label: string };
