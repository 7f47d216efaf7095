import type { FlagKind } from "@/lib/engine";
import { formatFlagMagnitude } from "@/lib/format/quantity";

/** What matching needs of one signature of a run (the engine report's flag fields). */
export type MatchableSignature = {
  kind: FlagKind;
  energyEv: number | null;
  /** The flag's magnitude in its own unit (fraction, meV or signal), signed as the engine reports it. */
  magnitude: number | null;
  /** Standard uncertainty of magnitude. */
  uncertainty: number | null;
  /** FWHM of the band the flag sits on, meV, when known (see bandWidthAt). */
  widthMeV: number | null;
};

export type PreviousSignature = MatchableSignature & { id: string; reviewState: "awaiting" | "confirmed" | "dismissed" };

/** Per run: the spacing of its energy grid, meV; the finest position a flag of that run can have. */
export type RunResolution = { stepMeV: number | null };

export type MatchOutcome =
  | { match: null }
  | { match: PreviousSignature; distanceMeV: number | null; carries: true }
  | { match: PreviousSignature; distanceMeV: number | null; carries: false; reason: string };

/**
 * Smallest position tolerance, meV, when neither run says how wide the band is or how fine its
 * grid is. Re-smoothing moves a band's fitted position by a few meV (common practice).
 */
export const MIN_MATCH_TOLERANCE_MEV = 10;

/** A flag's position is known to about one grid step; three steps covers a re-run on another grid (common practice). */
export const GRID_STEPS_OF_TOLERANCE = 3;

/**
 * A decision carries to the same band of a new run only while the band's size stays within this
 * factor of the size that was decided on (either way), unless the two sizes agree within
 * CARRY_SIGMAS combined standard uncertainties. A bleach of 40 % that comes back as 12 % is a
 * different finding to judge, not the one a lead confirmed (rule of this project).
 */
export const MAX_CARRY_RATIO = 2;
export const CARRY_SIGMAS = 3;

/**
 * How far apart two flags of one kind may sit and still be one band: half the wider band's FWHM
 * (two bands of one kind closer than that would not be told apart as two: a Rayleigh-like
 * resolution criterion, common practice), and never less than GRID_STEPS_OF_TOLERANCE steps of
 * the coarser run's grid (the run's own position uncertainty) or MIN_MATCH_TOLERANCE_MEV.
 */
export function matchToleranceMeV(
  a: MatchableSignature,
  b: MatchableSignature,
  runs: { previous: RunResolution; next: RunResolution },
): number {
  const halfWidth = Math.max(a.widthMeV ?? 0, b.widthMeV ?? 0) / 2;
  const step = Math.max(runs.previous.stepMeV ?? 0, runs.next.stepMeV ?? 0) * GRID_STEPS_OF_TOLERANCE;
  return Math.max(halfWidth, step, MIN_MATCH_TOLERANCE_MEV);
}

function magnitudeText(s: MatchableSignature): string {
  return s.magnitude === null ? "unknown" : formatFlagMagnitude({ kind: s.kind, magnitude: s.magnitude, unit: null });
}

/**
 * Whether a decision on `previous` still holds for `next`, the same band in a newer run: the
 * rule of MAX_CARRY_RATIO and CARRY_SIGMAS. A sign change (a shift that turned from red to blue)
 * never carries. Returns the reason when it does not.
 */
export function decisionCarries(
  previous: MatchableSignature,
  next: MatchableSignature,
): { carries: true } | { carries: false; reason: string } {
  const a = previous.magnitude;
  const b = next.magnitude;
  if (a === null || b === null || !Number.isFinite(a) || !Number.isFinite(b)) return { carries: true };
  const combined = Math.hypot(previous.uncertainty ?? 0, next.uncertainty ?? 0);
  if (combined > 0 && Math.abs(a - b) <= CARRY_SIGMAS * combined) return { carries: true };
  if (Math.sign(a) !== Math.sign(b) && a !== 0 && b !== 0) {
    return { carries: false, reason: `its sign changed (${magnitudeText(previous)} before, ${magnitudeText(next)} now)` };
  }
  const ratio = Math.abs(b) / Math.abs(a);
  if (ratio > MAX_CARRY_RATIO || ratio < 1 / MAX_CARRY_RATIO) {
    return {
      carries: false,
      reason: `its size changed from ${magnitudeText(previous)} to ${magnitudeText(next)} (more than a factor of ${MAX_CARRY_RATIO})`,
    };
  }
  return { carries: true };
}

/**
 * Pairs each signature of a new run with at most one signature of the run before: same kind, and
 * positions within matchToleranceMeV (flags without a position, such as an integrated PL quench,
 * pair by kind alone). Closest pairs are taken first, one to one. Returns one outcome per new
 * signature, in order; previous signatures left unpaired are those the new run no longer finds.
 */
export function matchSignatures(
  previous: readonly PreviousSignature[],
  next: readonly MatchableSignature[],
  runs: { previous: RunResolution; next: RunResolution },
): MatchOutcome[] {
  const pairs: { p: number; n: number; distance: number; distanceMeV: number | null }[] = [];
  previous.forEach((ps, p) => {
    next.forEach((ns, n) => {
      if (ps.kind !== ns.kind) return;
      if (ps.energyEv === null || ns.energyEv === null) {
        if (ps.energyEv === null && ns.energyEv === null) pairs.push({ p, n, distance: 0, distanceMeV: null });
        return;
      }
      const distanceMeV = Math.abs(ps.energyEv - ns.energyEv) * 1000;
      if (distanceMeV <= matchToleranceMeV(ps, ns, runs)) pairs.push({ p, n, distance: distanceMeV, distanceMeV });
    });
  });
  pairs.sort((x, y) => x.distance - y.distance || x.n - y.n || x.p - y.p);
  const takenP = new Set<number>();
  const out: MatchOutcome[] = next.map(() => ({ match: null }));
  const takenN = new Set<number>();
  for (const pair of pairs) {
    if (takenP.has(pair.p) || takenN.has(pair.n)) continue;
    takenP.add(pair.p);
    takenN.add(pair.n);
    const match = previous[pair.p]!;
    const verdict = decisionCarries(match, next[pair.n]!);
    out[pair.n] = verdict.carries
      ? { match, distanceMeV: pair.distanceMeV, carries: true }
      : { match, distanceMeV: pair.distanceMeV, carries: false, reason: verdict.reason };
  }
  return out;
}

/** What bandWidthAt reads of a run's report. */
export type WidthSource = {
  peaks?: readonly { energyEv: number; fwhmMeV: number | null }[] | null;
  referenceFirstExciton?: { energyEv: number; fwhmMeV: number | null } | null;
};

/**
 * FWHM (meV) of the band a flag sits on: the nearest band of the sample (or the reference's
 * first exciton, where a bleach is read) whose half width covers the flag's energy; null when
 * none does.
 */
export function bandWidthAt(source: WidthSource | null | undefined, energyEv: number | null): number | null {
  if (!source || energyEv === null) return null;
  const bands = [...(source.peaks ?? []), ...(source.referenceFirstExciton ? [source.referenceFirstExciton] : [])];
  let best: { distance: number; width: number } | null = null;
  for (const band of bands) {
    if (band.fwhmMeV === null || !(band.fwhmMeV > 0) || !Number.isFinite(band.energyEv)) continue;
    const distance = Math.abs(band.energyEv - energyEv) * 1000;
    if (distance > band.fwhmMeV / 2) continue;
    if (!best || distance < best.distance) best = { distance, width: band.fwhmMeV };
  }
  return best?.width ?? null;
}
