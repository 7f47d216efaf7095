import { describe, expect, it } from "vitest";
import { analyseSeries } from "@/lib/series/analyseSeries";
import { seriesPanels, seriesTechnique, sternVolmerLine, sternVolmerRatios } from "@/lib/series/seriesPanels";

// Known truth: the Stern–Volmer relation F₀/F = 1 + K_SV[Q] (Lakowicz, Principles of Fluorescence
// Spectroscopy, 3rd ed., 2006, ch. 8, eq. 8.1). Emission made with K_SV = 0.08 µM⁻¹ gives quench
// fractions q = 1 − F/F₀, and the panel must plot F₀/F = 1/(1 − q) = 1 + 0.08·[Q] exactly.
const K = 0.08;
const Q = [0, 2.5, 5, 10, 20];
const F0 = 20000;
const plRows = Q.map((c) => {
  const F = F0 / (1 + K * c);
  return { value: c, technique: "pl", bleachFraction: null, quenchFraction: 1 - F / F0, shiftMeV: null, newBandArea: null };
});

describe("Stern–Volmer panel", () => {
  it("plots F₀/F against [Q] with the fitted line of slope K_SV", () => {
    const panels = seriesPanels("pl", plRows, analyseSeries(plRows));
    const sv = panels.find((p) => p.key === "stern-volmer")!;
    expect(sv.title).toBe("Stern–Volmer: F₀/F against [Q]");
    expect(sv.yLabel).toBe("F₀/F");
    expect(sv.x).toEqual(Q);
    sv.y.forEach((r, i) => expect(r).toBeCloseTo(1 + K * Q[i]!, 12));
    expect(sv.fit!.x).toEqual([0, 20]);
    expect(sv.fit!.y[0]).toBeCloseTo(1, 12); // intercept 1 at [Q] = 0
    expect(sv.fit!.y[1]).toBeCloseTo(1 + K * 20, 12);
  });

  it("reads no quench as no point, not as F₀/F = 1", () => {
    expect(sternVolmerRatios([null, 0, 0.5])).toEqual([null, 1, 2]);
    expect(sternVolmerLine({ ksv: 0.5, intercept: 1 }, 0, 4)).toEqual({ x: [0, 4], y: [1, 3] });
  });
});

describe("panels by technique (TECHNIQUE_SPECS[t].seriesPlot)", () => {
  it("a PL series has no bleach panel and no first-exciton panel", () => {
    const rows = plRows.map((r, i) => ({ ...r, shiftMeV: i === 0 ? 0 : -1.5 * i }));
    const panels = seriesPanels("pl", rows, analyseSeries(rows));
    expect(panels.map((p) => p.key)).toEqual(["stern-volmer", "shift"]);
    expect(panels.map((p) => p.title).join(" ")).not.toMatch(/exciton|bleach/i);
    expect(panels[1]!.title).toBe("Shift of the emission maximum");
  });

  it("an absorption series draws the bleach with its two-line fit and no Stern–Volmer panel", () => {
    // Bleach rising 40 % per equivalent to a plateau at 1 equivalent (a made-up titration).
    const eq = [0, 0.25, 0.5, 0.75, 1, 1.25, 1.5];
    const rows = eq.map((v) => ({
      value: v,
      technique: "absorption",
      bleachFraction: 0.4 * Math.min(v, 1),
      quenchFraction: null,
      shiftMeV: null,
      newBandArea: null,
    }));
    const panels = seriesPanels("absorption", rows, analyseSeries(rows));
    expect(panels.map((p) => p.key)).toEqual(["bleach"]);
    expect(panels[0]!.title).toBe("Bleach of the first exciton");
    expect(panels[0]!.fit!.y.at(-1)).toBeCloseTo(40, 6); // plateau 40 %
  });

  it("takes the technique most of the series' spectra have", () => {
    expect(seriesTechnique([{ technique: "pl" }, { technique: "pl" }, { technique: "absorption" }])).toBe("pl");
    expect(seriesTechnique([])).toBe("absorption");
  });
});
