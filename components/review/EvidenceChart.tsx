"use client";

import { useMemo } from "react";
import { LinePlot, type PlotCurve } from "@/components/charts/LinePlot";
import { CURVE_STYLES } from "@/components/charts/theme";
import { CM1_PER_EV } from "@/lib/engine/constants";
import { FLAG_COLOURS, kindLabel, type FlagKind } from "@/lib/registry/flagKinds";
import { TECHNIQUE_SPECS, type Technique } from "@/lib/registry/techniques";
import { yUnitLabel } from "@/lib/format/unitLabels";

/**
 * Sample against reference around a flag, in the house chart look: energy for electronic spectra,
 * wavenumber (high to low, as the technique's default) for mid-IR; the flag drawn as a labelled marker.
 */
export function EvidenceChart({
  energy,
  sample,
  reference,
  centreEv,
  sampleName,
  referenceName,
  unit,
  kind,
  technique,
}: {
  energy: number[];
  sample: number[];
  reference: (number | null)[] | null;
  centreEv: number | null;
  sampleName: string;
  referenceName: string | null;
  unit: string;
  kind: FlagKind;
  technique: Technique;
}) {
  const spec = TECHNIQUE_SPECS[technique];
  const wavenumber = spec.defaultAxis === "cm-1";
  const x = useMemo(() => (wavenumber ? energy.map((e) => e * CM1_PER_EV) : energy), [energy, wavenumber]);
  const curves = useMemo<PlotCurve[]>(
    () => [
      { key: "sample", label: `sample ${sampleName}`, style: CURVE_STYLES.sample, y: sample },
      ...(reference
        ? [{ key: "reference", label: `reference ${referenceName ?? "parent"}`, style: CURVE_STYLES.reference, y: reference }]
        : []),
    ],
    [sample, reference, sampleName, referenceName],
  );
  if (energy.length < 2) return null;
  const yText = unit === "counts" ? "emission (counts per eV)" : yUnitLabel(unit) || "signal";
  const yLabel = yText.charAt(0).toUpperCase() + yText.slice(1);
  const markers =
    centreEv === null
      ? []
      : [{ id: "flag", at: wavenumber ? centreEv * CM1_PER_EV : centreEv, label: kindLabel(kind, technique), colour: FLAG_COLOURS[kind] }];
  return (
    <LinePlot
      x={x}
      curves={curves}
      xLabel={wavenumber ? "Wavenumber (cm⁻¹)" : "Energy (eV)"}
      xUnit={wavenumber ? "cm⁻¹" : "eV"}
      yLabel={yLabel}
      height={300}
      markers={markers}
      descending={wavenumber && spec.defaultDirection === "descending"}
      testId="evidence-chart"
      ariaLabel={`Spectra of ${sampleName}${referenceName ? ` and its reference ${referenceName}` : ""} around the flagged band`}
    />
  );
}
