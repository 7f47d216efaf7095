import { toEnergyAxis } from "@/lib/engine";
import { TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import { parsedRawFile, storedReadChoice } from "@/lib/rawSpectra";
import { Spectrum } from "@/models";

export type Evidence = {
  /** Energy axis of the window, eV, ascending. */
  energy: number[];
  sample: number[];
  /** The reference interpolated onto the sample's axis; null outside its range. */
  reference: (number | null)[] | null;
  centreEv: number | null;
  halfWidthEv: number;
  sampleName: string;
  referenceName: string | null;
  unit: string;
  /** Why there is nothing to draw, when there is nothing. */
  problem: string | null;
};

const MAX_POINTS = 800;

async function energyArrays(spectrum: Spectrum) {
  const parsed = await parsedRawFile(spectrum, storedReadChoice(spectrum));
  const { energy, signal } = toEnergyAxis(parsed.x, parsed.y, parsed.xUnit, { emission: TECHNIQUE_SPECS[spectrum.technique].jacobian });
  // Ascending energy.
  const idx = Array.from(energy.keys()).sort((a, b) => energy[a]! - energy[b]!);
  return { energy: idx.map((i) => energy[i]!), signal: idx.map((i) => signal[i]!), unit: parsed.yUnit };
}

function interpolate(xs: number[], ys: number[], x: number): number | null {
  if (xs.length === 0 || x < xs[0]! || x > xs[xs.length - 1]!) return null;
  let lo = 0,
    hi = xs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid]! <= x) lo = mid;
    else hi = mid;
  }
  const span = xs[hi]! - xs[lo]!;
  return span > 0 ? ys[lo]! + ((ys[hi]! - ys[lo]!) * (x - xs[lo]!)) / span : ys[lo]!;
}

/**
 * The overlaid spectra around a flag: sample and reference on an energy axis, cut to the flag's
 * energy ± halfWidthEv (the whole range when the flag has no energy), thinned for drawing.
 * Read access must have been checked by the caller.
 */
export async function loadEvidence(
  spectrumId: string,
  referenceSpectrumId: string | null,
  centreEv: number | null,
  halfWidthEv = 0.3,
): Promise<Evidence> {
  const spectrum = await Spectrum.findByPk(spectrumId);
  const reference = referenceSpectrumId ? await Spectrum.findByPk(referenceSpectrumId) : null;
  const base = { centreEv, halfWidthEv, sampleName: spectrum?.fileName ?? "", referenceName: reference?.fileName ?? null };
  if (!spectrum) return { ...base, energy: [], sample: [], reference: null, unit: "", problem: "The spectrum is gone." };
  try {
    const s = await energyArrays(spectrum);
    const r = reference ? await energyArrays(reference) : null;
    const inWindow = (e: number) => centreEv === null || Math.abs(e - centreEv) <= halfWidthEv;
    let keep = s.energy.map((e, i) => i).filter((i) => inWindow(s.energy[i]!));
    if (keep.length > MAX_POINTS) {
      const step = keep.length / MAX_POINTS;
      keep = Array.from({ length: MAX_POINTS }, (_, k) => keep[Math.floor(k * step)]!);
    }
    const energy = keep.map((i) => s.energy[i]!);
    return {
      ...base,
      energy,
      sample: keep.map((i) => s.signal[i]!),
      reference: r ? energy.map((e) => interpolate(r.energy, r.signal, e)) : null,
      unit: s.unit,
      problem: energy.length < 2 ? "The spectrum has no points within 0.3 eV of the flag." : null,
    };
  } catch (error) {
    console.error(
      JSON.stringify({
        level: "warn",
        msg: "evidence not loaded",
        spectrumId,
        error: error instanceof Error ? error.message : String(error),
      }),
    );
    return {
      ...base,
      energy: [],
      sample: [],
      reference: null,
      unit: "",
      problem: "The raw files could not be read back from storage just now; try again.",
    };
  }
}
