"use client";

import { useMemo, useState } from "react";
import { MATERIALS } from "@/lib/engine/derived/materials";
import { SIZING_CURVES } from "@/lib/engine/derived/sizingCurves";
import type { MaterialName } from "@/lib/engine/types";
import { boundRatioFromDepletion } from "@/lib/fits/boundRatioFromDepletion";

const input = "rounded-md border border-stone-300 px-2 py-1 text-sm";
const names = Object.keys(MATERIALS) as MaterialName[];

function extinction(material: MaterialName, firstExcitonNm: number) {
  const res = SIZING_CURVES[MATERIALS[material].defaultSizing].size(firstExcitonNm);
  return { epsilon: res.extinctionPerMPerCm, at: res.extinctionAt === "400nm" ? "400 nm" : "its first exciton", diameter: res.diameterNm, warnings: res.warnings };
}

/**
 * Supernatant depletion: what is bound of each dot at each point (added − left, left by
 * Beer–Lambert with the engine's size-dependent ε) and whether the bound ratio stays constant.
 */
export function DepletionPanel() {
  const [a, setA] = useState<{ material: MaterialName; nm: string }>({ material: "CdSe", nm: "577" });
  const [x, setX] = useState<{ material: MaterialName; nm: string }>({ material: "PbS", nm: "1200" });
  const [path, setPath] = useState("1");
  // Example values (a 1:1 product, 0.2 µM of A); replace them with your own.
  const [rows, setRows] = useState("0.2, 0.1, 0.0191, 0.000\n0.2, 0.2, 0.0019, 0.0166\n0.2, 0.4, 0.000, 0.331");
  const result = useMemo(() => {
    const nmA = Number(a.nm), nmX = Number(x.nm), l = Number(path);
    if (!(nmA > 0)) return { error: "First exciton of dot A: give a wavelength in nm." };
    if (!(nmX > 0)) return { error: "First exciton of dot X: give a wavelength in nm." };
    if (!(l > 0)) return { error: "Path length: give a positive number of cm." };
    const points = [];
    const lines = rows.split(/\n/).map((s) => s.trim()).filter(Boolean);
    for (const [i, line] of lines.entries()) {
      const cells = line.split(/[,;\t ]+/).map(Number);
      if (cells.length !== 4 || cells.some((c) => !Number.isFinite(c))) return { error: `Points, line ${i + 1}: give four numbers (added A µM, added X µM, absorbance of A, absorbance of X).` };
      points.push({ addedA: cells[0]!, addedX: cells[1]!, absorbanceA: cells[2]!, absorbanceX: cells[3]! });
    }
    try {
      const eA = extinction(a.material, nmA), eX = extinction(x.material, nmX);
      return { eA, eX, out: boundRatioFromDepletion(points, { epsilonA: eA.epsilon, epsilonX: eX.epsilon, pathLengthCm: l }) };
    } catch (error) {
      return { error: `Points: ${error instanceof Error ? error.message : String(error)}.` };
    }
  }, [a, x, path, rows]);

  return (
    <section className="rounded-lg border border-stone-200 bg-white p-4" aria-labelledby="depletion-title">
      <h2 id="depletion-title" className="mb-1 text-sm font-semibold uppercase tracking-wide text-ink-soft">Composition from supernatant depletion</h2>
      <p className="mb-3 text-xs text-ink-soft">Bound = added − left in the supernatant, left by Beer–Lambert c = A/(ε·l) with ε from each dot&apos;s sizing curve. Give each absorbance where only that dot absorbs (or corrected for the other).</p>
      <div className="mb-3 flex flex-wrap gap-3 text-xs text-ink-soft">
        {([["A", a, setA], ["X", x, setX]] as const).map(([label, v, set]) => (
          <fieldset key={label} className="flex items-end gap-2">
            <label>Dot {label}<br />
              <select className={input} value={v.material} onChange={(e) => set({ ...v, material: e.target.value as MaterialName })}>{names.map((n) => <option key={n}>{n}</option>)}</select>
            </label>
            <label>first exciton (nm)<br /><input className={`${input} w-24`} inputMode="decimal" value={v.nm} onChange={(e) => set({ ...v, nm: e.target.value })} /></label>
          </fieldset>
        ))}
        <label>Path length (cm)<br /><input className={`${input} w-20`} inputMode="decimal" value={path} onChange={(e) => setPath(e.target.value)} /></label>
      </div>
      <label className="block text-xs text-ink-soft" htmlFor="depletion-rows">Points, one per line: added A (µM), added X (µM), supernatant absorbance of A, of X (the example shows a 1:1 product: replace it with your numbers)
        <textarea id="depletion-rows" rows={4} className={`${input} mt-1 block w-full font-mono text-ink`} value={rows} onChange={(e) => setRows(e.target.value)} />
      </label>
      {"error" in result ? (
        <p role="alert" className="mt-2 text-sm text-red-700">{result.error}</p>
      ) : (
        <div className="mt-3 text-sm">
          <p className="text-xs text-ink-soft">ε(A) = {result.eA.epsilon.toExponential(3)} M⁻¹cm⁻¹ at {result.eA.at} (D ≈ {result.eA.diameter.toFixed(2)} nm); ε(X) = {result.eX.epsilon.toExponential(3)} M⁻¹cm⁻¹ at {result.eX.at} (D ≈ {result.eX.diameter.toFixed(2)} nm).</p>
          <table className="mt-2 w-full tabular text-sm">
            <thead className="text-left text-xs text-ink-soft"><tr><th>feed X:A</th><th>left A (µM)</th><th>left X (µM)</th><th>bound A</th><th>bound X</th><th>bound X:A</th></tr></thead>
            <tbody>{result.out.rows.map((r, i) => (
              <tr key={i} className="border-t border-stone-100"><td>{r.feedRatio.toFixed(2)}</td><td>{r.leftA.toFixed(3)}</td><td>{r.leftX.toFixed(3)}</td><td>{r.boundA.toFixed(3)}</td><td>{r.boundX.toFixed(3)}</td><td>{r.boundRatio === null ? "—" : r.boundRatio.toFixed(2)}</td></tr>
            ))}</tbody>
          </table>
          <p className="mt-2" data-testid="depletion-summary">
            Bound ratio X:A {result.out.meanBoundRatio === null ? "—" : result.out.meanBoundRatio.toFixed(2)}{result.out.sdBoundRatio !== null && ` ± ${result.out.sdBoundRatio.toFixed(2)} (sd)`} while the feed ratio changed {result.out.feedFoldChange.toFixed(1)}-fold:{" "}
            <strong>{result.out.constant ? "constant: a definite composition" : "not constant within 10 %"}</strong>
          </p>
          {[...result.out.warnings, ...result.eA.warnings, ...result.eX.warnings].map((w) => <p key={w} className="text-xs text-caution">{w}</p>)}
        </div>
      )}
    </section>
  );
}
