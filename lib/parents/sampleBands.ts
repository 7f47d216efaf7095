import type { MatchSide } from "@/lib/engine/compare/checkReferenceMatch";
import { matchFirstExciton } from "@/lib/engine/peaks/matchFirstExciton";
import type { Technique } from "@/lib/engine";

/** A band of a file not yet stored, as the engine found it (position and width). */
export type BandPosition = { energyEv: number; fwhmMeV: number | null };

/**
 * What the engine found in a file before it is stored (the preview): its technique, its
 * range on the energy axis, its first exciton (or emission maximum) and every band it could
 * take for one, so the parent check can follow a parent the way the analysis does.
 */
export type SampleBands = {
  technique: Technique;
  rangeEv: [number, number];
  firstExciton: BandPosition | null;
  peaks: BandPosition[];
};

/**
 * The sample's side of the engine's reference check against one parent: as in
 * analyzeSpectrum, the sample's first exciton is the feature nearest the parent's
 * (lib/engine/peaks/matchFirstExciton.ts), else the one found on its own.
 */
export function sampleSideAgainst(bands: SampleBands, parentFirstEv: number | null): MatchSide {
  let band = bands.firstExciton;
  if (band && parentFirstEv !== null) band = matchFirstExciton(bands.peaks, parentFirstEv) ?? band;
  return { technique: bands.technique, rangeEv: bands.rangeEv, bandEv: band?.energyEv ?? null, fwhmMeV: band?.fwhmMeV ?? null };
}
