// Our own marker colours: flags by kind (from the flag-kind registry), peaks in a quiet ink; curves in the house chart styles.
import { CURVE_STYLES, type CurveStyle } from "@/components/charts/theme";
import type { SeriesKey } from "@/lib/spectrum-view/payload";

export { FLAG_COLOURS } from "@/lib/registry/flagKinds";
export const PEAK_COLOUR = "#8a93a3";

export const SERIES_STYLE: Readonly<Record<SeriesKey, CurveStyle & { label: string }>> = {
  raw: { label: "measured", ...CURVE_STYLES.measured },
  smoothed: { label: "smoothed", ...CURVE_STYLES.smoothed },
  reference: { label: "parent reference", ...CURVE_STYLES.reference },
  difference: { label: "difference (right axis)", ...CURVE_STYLES.difference },
};
