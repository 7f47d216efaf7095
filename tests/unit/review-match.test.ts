import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { analyzeSpectrum } from "@/lib/engine";
import {
  CARRY_SIGMAS,
  MAX_CARRY_RATIO,
  MIN_MATCH_TOLERANCE_MEV,
  bandWidthAt,
  decisionCarries,
  matchSignatures,
  matchToleranceMeV,
  type MatchableSignature,
  type PreviousSignature,
} from "@/lib/review/matchSignatures";
import { absorbanceSpectrum, PARENT_BANDS } from "../engine/synthetic";

// Sources: FWHM = 2√(2 ln 2)·σ ≈ 2.3548·σ for a Gaussian band (standard result); the synthetic
// spectra's bands are known truth (tests/engine/synthetic.ts); "half the wider FWHM" as the
// distance below which two bands of one kind are one band is a Rayleigh-like resolution criterion
// (common practice); the twofold carry rule is this project's own rule (lib/review/matchSignatures.ts),
// checked here on both sides of its edge.

const runs = { previous: { stepMeV: 2 }, next: { stepMeV: 2 } };
const prev = (over: Partial<PreviousSignature>): PreviousSignature => ({
  id: over.id ?? "p",
  kind: "bleach",
  energyEv: 2.2,
  magnitude: 0.4,
  uncertainty: 0.005,
  widthMeV: 106,
  reviewState: "confirmed",
  ...over,
});
const next = (over: Partial<MatchableSignature>): MatchableSignature => ({
  kind: "bleach",
  energyEv: 2.2,
  magnitude: 0.4,
  uncertainty: 0.005,
  widthMeV: 106,
  ...over,
});

describe("position tolerance", () => {
  it("is half the wider band's FWHM, or three grid steps, never under the floor", () => {
    expect(matchToleranceMeV(next({ widthMeV: 106 }), next({ widthMeV: 90 }), runs)).toBe(53);
    expect(matchToleranceMeV(next({ widthMeV: 10 }), next({ widthMeV: 10 }), { previous: { stepMeV: 5 }, next: { stepMeV: 2 } })).toBe(15);
    expect(
      matchToleranceMeV(next({ widthMeV: null }), next({ widthMeV: null }), { previous: { stepMeV: null }, next: { stepMeV: null } }),
    ).toBe(MIN_MATCH_TOLERANCE_MEV);
  });

  it("matches a bleach that moved 5 meV, not one 150 meV away, nor a shift at the same energy", () => {
    const previous = [prev({ id: "a" })];
    expect(matchSignatures(previous, [next({ energyEv: 2.205 })], runs)[0]!.match?.id).toBe("a");
    expect(matchSignatures(previous, [next({ energyEv: 2.35 })], runs)[0]!.match).toBeNull();
    expect(matchSignatures(previous, [next({ kind: "shift", energyEv: 2.2, magnitude: 8 })], runs)[0]!.match).toBeNull();
  });

  it("pairs one to one, closest first: two new bands 120 meV apart keep their own decisions", () => {
    const previous = [
      prev({ id: "low", kind: "new-band", energyEv: 1.9, widthMeV: 80, magnitude: 0.05, uncertainty: 0.002, reviewState: "confirmed" }),
      prev({ id: "high", kind: "new-band", energyEv: 2.02, widthMeV: 80, magnitude: 0.05, uncertainty: 0.002, reviewState: "dismissed" }),
    ];
    const out = matchSignatures(
      previous,
      [
        next({ kind: "new-band", energyEv: 2.015, widthMeV: 80, magnitude: 0.05, uncertainty: 0.002 }),
        next({ kind: "new-band", energyEv: 1.905, widthMeV: 80, magnitude: 0.05, uncertainty: 0.002 }),
      ],
      runs,
    );
    expect(out.map((o) => o.match?.id)).toEqual(["high", "low"]);
  });

  it("flags without a position (an integrated PL quench) pair by kind", () => {
    const out = matchSignatures(
      [prev({ id: "q", kind: "pl-quench", energyEv: null, magnitude: 0.5 })],
      [next({ kind: "pl-quench", energyEv: null, magnitude: 0.45 })],
      runs,
    );
    expect(out[0]!.match?.id).toBe("q");
  });

  it("recovers every band's identity when bands sit further apart than their widths (property)", () => {
    // Known truth: band k of the new run is band k of the old one, jittered by less than a quarter FWHM.
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -0.24, max: 0.24, noNaN: true }), { minLength: 1, maxLength: 6 }),
        fc.integer({ min: 40, max: 150 }),
        (jitters, width) => {
          const previous = jitters.map((_, k) =>
            prev({
              id: `b${k}`,
              kind: "new-band",
              energyEv: 1.5 + (k * 2.5 * width) / 1000,
              widthMeV: width,
              magnitude: 0.05,
              uncertainty: 0.002,
            }),
          );
          const shuffled = jitters
            .map((j, k) => ({
              k,
              s: next({
                kind: "new-band",
                energyEv: 1.5 + (k * 2.5 * width + j * width) / 1000,
                widthMeV: width,
                magnitude: 0.05,
                uncertainty: 0.002,
              }),
            }))
            .reverse();
          const out = matchSignatures(
            previous,
            shuffled.map((x) => x.s),
            { previous: { stepMeV: 1 }, next: { stepMeV: 1 } },
          );
          return out.every((o, i) => o.match?.id === `b${shuffled[i]!.k}`);
        },
      ),
    );
  });
});

describe("whether a decision carries (project rule: within a factor of 2, or within 3 combined σ)", () => {
  it("a 40 % bleach that comes back as 30 % keeps its decision", () => {
    expect(decisionCarries(next({ magnitude: 0.4 }), next({ magnitude: 0.3 }))).toEqual({ carries: true });
  });

  it("a 40 % bleach that comes back as 12 % does not, and says why", () => {
    const verdict = decisionCarries(next({ magnitude: 0.4 }), next({ magnitude: 0.12 }));
    expect(verdict.carries).toBe(false);
    if (!verdict.carries) expect(verdict.reason).toBe(`its size changed from 40.0 % to 12.0 % (more than a factor of ${MAX_CARRY_RATIO})`);
  });

  it("a small noisy flag that moved within its uncertainty carries despite a large ratio", () => {
    // |0.06 − 0.025| = 0.035 ≤ 3·√(0.01² + 0.01²) = 0.0424
    expect(CARRY_SIGMAS * Math.hypot(0.01, 0.01)).toBeGreaterThan(0.035);
    expect(decisionCarries(next({ magnitude: 0.06, uncertainty: 0.01 }), next({ magnitude: 0.025, uncertainty: 0.01 }))).toEqual({
      carries: true,
    });
  });

  it("a red shift that turned blue does not carry", () => {
    const verdict = decisionCarries(
      next({ kind: "shift", magnitude: -8, uncertainty: 1 }),
      next({ kind: "shift", magnitude: 8, uncertainty: 1 }),
    );
    expect(verdict.carries).toBe(false);
  });
});

describe("band width at a flag", () => {
  it("reads the FWHM of the band the flag sits on, and nothing for a flag between bands", () => {
    const source = {
      peaks: [
        { energyEv: 2.2, fwhmMeV: 106 },
        { energyEv: 2.42, fwhmMeV: 165 },
      ],
      referenceFirstExciton: null,
    };
    expect(bandWidthAt(source, 2.21)).toBe(106);
    expect(bandWidthAt(source, 2.31)).toBeNull();
    expect(bandWidthAt(source, null)).toBeNull();
  });
});

describe("the engine's own flags across two smoothing windows (the re-run of the issue)", () => {
  // A 30 % bleach of the first exciton (σ 45 meV, so FWHM 106 meV), analysed with two windows.
  const noise = 0.002;
  const reference = absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed: 1 });
  const bleached = absorbanceSpectrum({ bands: PARENT_BANDS.map((b, i) => (i === 0 ? { ...b, a: b.a * 0.7 } : b)), noise, seed: 3 });
  const asMatchable = (r: ReturnType<typeof analyzeSpectrum>) =>
    r.flags.map((f) => ({
      kind: f.kind,
      energyEv: f.energyEv,
      magnitude: f.magnitude,
      uncertainty: f.uncertainty,
      widthMeV: bandWidthAt(r, f.energyEv),
    }));

  it("the bleach of the second run is the bleach of the first, and a confirmation carries", () => {
    const first = analyzeSpectrum(bleached, { reference, smoothingWindow: 9 });
    const second = analyzeSpectrum(bleached, { reference, smoothingWindow: 21 });
    const firstBleach = asMatchable(first).find((f) => f.kind === "bleach")!;
    expect(firstBleach).toBeDefined();
    // FWHM of the first exciton near 2.3548 · 45 meV = 106 meV (Gaussian), the engine's width within 25 %
    expect(firstBleach.widthMeV!).toBeGreaterThan(106 * 0.75);
    expect(firstBleach.widthMeV!).toBeLessThan(106 * 1.25);
    const out = matchSignatures([{ ...firstBleach, id: "bleach-1", reviewState: "confirmed" }], asMatchable(second), {
      previous: { stepMeV: first.parameters.grid.stepMeV },
      next: { stepMeV: second.parameters.grid.stepMeV },
    });
    const i = second.flags.findIndex((f) => f.kind === "bleach");
    expect(out[i]).toMatchObject({ match: { id: "bleach-1" }, carries: true });
  });

  it("a noise-only re-run finds no bleach: the confirmed one would be superseded, not carried", () => {
    const clean = absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed: 2 });
    const first = analyzeSpectrum(bleached, { reference });
    const second = analyzeSpectrum(clean, { reference });
    expect(second.flags).toEqual([]);
    const out = matchSignatures(
      asMatchable(first).map((f, k) => ({ ...f, id: `f${k}`, reviewState: "confirmed" as const })),
      asMatchable(second),
      runs,
    );
    expect(out).toEqual([]);
  });
});
