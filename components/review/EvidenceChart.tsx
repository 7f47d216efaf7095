"use client";

import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";

/** Sample against reference around a flag, on an energy axis; a dashed line marks the flag. */
export function EvidenceChart({ energy, sample, reference, centreEv, sampleName, referenceName, unit }: {
  energy: number[]; sample: number[]; reference: (number | null)[] | null; centreEv: number | null;
  sampleName: string; referenceName: string | null; unit: string;
}) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = box.current;
    if (!el || energy.length < 2) return;
    const series: uPlot.Series[] = [
      { label: "Energy (eV)", value: (_u, v) => (v == null ? "—" : v.toFixed(3)) },
      { label: `Sample: ${sampleName}`, stroke: "#d9622b", width: 2 },
    ];
    const data: uPlot.AlignedData = [energy, sample];
    if (reference) {
      series.push({ label: `Reference: ${referenceName ?? "parent"}`, stroke: "#4b5566", width: 1.5, dash: [6, 4] });
      (data as (number | null)[][]).push(reference);
    }
    const marker: uPlot.Plugin = {
      hooks: {
        draw: (u) => {
          if (centreEv === null) return;
          const x = u.valToPos(centreEv, "x", true);
          const ctx = u.ctx;
          ctx.save();
          ctx.strokeStyle = "#b7791f";
          ctx.setLineDash([3, 3]);
          ctx.beginPath();
          ctx.moveTo(x, u.bbox.top);
          ctx.lineTo(x, u.bbox.top + u.bbox.height);
          ctx.stroke();
          ctx.restore();
        },
      },
    };
    const plot = new uPlot(
      {
        width: Math.max(320, el.clientWidth),
        height: 300,
        scales: { x: { time: false } },
        axes: [{ label: "Energy (eV)" }, { label: unit === "counts" ? "PL (per eV)" : unit || "signal" }],
        series,
        plugins: [marker],
        legend: { live: true },
      },
      data,
      el,
    );
    const resize = () => plot.setSize({ width: Math.max(320, el.clientWidth), height: 300 });
    window.addEventListener("resize", resize);
    return () => {
      window.removeEventListener("resize", resize);
      plot.destroy();
    };
  }, [energy, sample, reference, centreEv, sampleName, referenceName, unit]);
  return <div ref={box} className="w-full" data-testid="evidence-chart" role="img" aria-label={`Spectra of ${sampleName}${referenceName ? ` and its reference ${referenceName}` : ""} around the flagged energy`} />;
}
