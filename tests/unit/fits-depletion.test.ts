import { describe, expect, it } from "vitest";
import { boundRatioFromDepletion } from "@/lib/fits/boundRatioFromDepletion";
import { SIZING_CURVES } from "@/lib/engine";

// Invented supernatant-depletion series: 1.0 µM CdSe (A) titrated with PbS (X); the product is
// 1:1, so what is bound is min(added A, added X) of each. Absorbances are made with Beer–Lambert
// (c = A/(ε·l), DOMAIN.md §3) and the engine's extinction for each dot.
const epsA = SIZING_CURVES["cdse-yu2003"].size(577).extinctionPerMPerCm; // Yu 2003 ε = 5857·D^2.65
const epsX = SIZING_CURVES["pbs-moreels2009"].size(1200).extinctionPerMPerCm; // Moreels 2009, ε at 400 nm
const l = 1;
function supernatant(addedA: number, addedX: number, bound: number) {
  return { addedA, addedX, absorbanceA: (addedA - bound) * 1e-6 * epsA * l, absorbanceX: (addedX - bound) * 1e-6 * epsX * l };
}

describe("boundRatioFromDepletion", () => {
  it("finds the 1:1 composition constant while the feed ratio changes four-fold (DOMAIN.md §6)", () => {
    const points = [supernatant(1, 0.5, 0.5), supernatant(1, 1, 0.9), supernatant(1, 2, 1)].map(
      (p, i) => (i === 1 ? { ...p, absorbanceX: 0.1e-6 * epsX } : p), // 0.9 bound of each: X left 0.1 µM
    );
    const r = boundRatioFromDepletion(points, { epsilonA: epsA, epsilonX: epsX, pathLengthCm: l });
    expect(r.rows.map((x) => x.boundRatio)).toEqual([expect.closeTo(1, 10), expect.closeTo(1, 10), expect.closeTo(1, 10)]);
    expect(r.meanBoundRatio).toBeCloseTo(1, 10);
    expect(r.sdBoundRatio).toBeCloseTo(0, 10);
    expect(r.feedFoldChange).toBeCloseTo(4, 12);
    expect(r.constant).toBe(true);
  });

  it("reports a changing composition as not constant (mean and sample sd by hand)", () => {
    const points = [supernatant(1, 0.5, 0.25), { addedA: 1, addedX: 2, absorbanceA: 0.5e-6 * epsA, absorbanceX: 0.5e-6 * epsX }];
    // point 1: bound A 0.25, bound X 0.25 → 1; point 2: bound A 0.5, bound X 1.5 → 3
    const r = boundRatioFromDepletion(points, { epsilonA: epsA, epsilonX: epsX, pathLengthCm: l });
    expect(r.rows[1]!.boundRatio).toBeCloseTo(3, 10);
    expect(r.meanBoundRatio).toBeCloseTo(2, 10);
    expect(r.sdBoundRatio).toBeCloseTo(Math.SQRT2, 10);
    expect(r.constant).toBe(false);
  });

  it("refuses bad input with messages naming the field", () => {
    expect(() => boundRatioFromDepletion([supernatant(1, 1, 0.5)], { epsilonA: epsA, epsilonX: epsX, pathLengthCm: 1 })).toThrow(
      /at least 2 points/,
    );
    expect(() =>
      boundRatioFromDepletion([supernatant(1, 1, 0.5), { ...supernatant(1, 1, 0.5), addedA: 0 }], {
        epsilonA: epsA,
        epsilonX: epsX,
        pathLengthCm: 1,
      }),
    ).toThrow("points[1].addedA must be positive");
    expect(() =>
      boundRatioFromDepletion([supernatant(1, 1, 0.5), supernatant(1, 1, 0.5)], { epsilonA: 0, epsilonX: epsX, pathLengthCm: 1 }),
    ).toThrow(/extinction must be positive/);
  });
});

describe("boundRatioFromDepletion with a path length per point", () => {
  it("gives the same composition for half the absorbance in a cell of half the length (c = A/(ε·l), Beer–Lambert)", () => {
    const points = [supernatant(1, 0.5, 0.5), supernatant(1, 2, 1)];
    const halved = points.map((p) => ({ ...p, absorbanceA: p.absorbanceA / 2, absorbanceX: p.absorbanceX / 2, pathLengthCm: 0.5 }));
    const a = boundRatioFromDepletion(points, { epsilonA: epsA, epsilonX: epsX, pathLengthCm: 1 });
    const b = boundRatioFromDepletion(halved, { epsilonA: epsA, epsilonX: epsX, pathLengthCm: 1 });
    b.rows.forEach((r, i) => {
      expect(r.leftA).toBeCloseTo(a.rows[i]!.leftA, 12);
      expect(r.leftX).toBeCloseTo(a.rows[i]!.leftX, 12);
    });
    expect(() =>
      boundRatioFromDepletion([points[0]!, { ...points[1]!, pathLengthCm: 0 }], { epsilonA: epsA, epsilonX: epsX, pathLengthCm: 1 }),
    ).toThrow("points[1].pathLengthCm must be positive");
  });
});
