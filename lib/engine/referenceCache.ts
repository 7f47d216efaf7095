import { processSpectrum, spectrumToEnergy, type ProcessOptions, type ProcessedSpectrum } from './processSpectrum';
import type { ParsedSpectrum, Technique } from './types';

/**
 * Memoises the processing of a reference spectrum, so that many samples analysed against the
 * same parent (a titration series, the benchmark) grid, smooth and search it once. Keyed by the
 * reference object (WeakMap: entries go when the caller drops the spectrum) and by every option
 * that shapes the result. A fingerprint of the arrays guards against a caller that changed the
 * reference's numbers in place between calls: the entry is then recomputed. Results are shared
 * between calls and must be treated as read-only.
 */
interface Entry {
  fingerprint: string;
  energy: Map<Technique, ReturnType<typeof spectrumToEnergy>>;
  processed: Map<string, ProcessedSpectrum>;
}

const MAX_PROCESSED_PER_REFERENCE = 8;
const cache = new WeakMap<ParsedSpectrum, Entry>();

function fingerprint(s: ParsedSpectrum): string {
  // two position-weighted sums per array: any in-place edit of a value changes them (up to rounding)
  let a = 0;
  let b = 0;
  let c = 0;
  let d = 0;
  const x = s.x;
  const y = s.y;
  for (let i = 0; i < x.length; i++) {
    a += x[i]!;
    b += x[i]! * (i + 1);
  }
  for (let i = 0; i < y.length; i++) {
    c += y[i]!;
    d += y[i]! * (i + 1);
  }
  return `${s.x.length}|${s.y.length}|${a}|${b}|${c}|${d}|${s.xUnit}|${s.yUnit}`;
}

function entryFor(ref: ParsedSpectrum): Entry {
  const fp = fingerprint(ref);
  let e = cache.get(ref);
  if (!e || e.fingerprint !== fp) {
    e = { fingerprint: fp, energy: new Map(), processed: new Map() };
    cache.set(ref, e);
  }
  return e;
}

/** spectrumToEnergy(ref, technique), memoised per reference object. */
export function referenceToEnergy(ref: ParsedSpectrum, technique: Technique): ReturnType<typeof spectrumToEnergy> {
  return energyOf(entryFor(ref), ref, technique);
}

function energyOf(e: Entry, ref: ParsedSpectrum, technique: Technique): ReturnType<typeof spectrumToEnergy> {
  let v = e.energy.get(technique);
  if (!v) {
    v = spectrumToEnergy(ref, technique);
    e.energy.set(technique, v);
  }
  return v;
}

/** processSpectrum of the reference on `grid` with options `o`, memoised per reference object. */
export function processReference(
  ref: ParsedSpectrum,
  technique: Technique,
  grid: { from: number; to: number; n: number },
  o: ProcessOptions,
): ProcessedSpectrum {
  // one fingerprint per call (it walks both arrays)
  const e = entryFor(ref);
  const re = energyOf(e, ref, technique);
  const key = JSON.stringify([
    technique,
    grid.from,
    grid.to,
    grid.n,
    o.technique,
    o.windowSize,
    o.derivativeWindowSize,
    o.polynomial,
    o.baseline,
    o.minSignificance,
    o.excitationNm ?? null,
    o.excitationExclusionNm,
    o.scale ?? 1,
    o.darkLevel ?? 'none',
    o.xUnit ?? null,
  ]);
  let p = e.processed.get(key);
  if (!p) {
    p = processSpectrum(re.energy, re.signal, grid, o);
    if (e.processed.size >= MAX_PROCESSED_PER_REFERENCE) e.processed.delete(e.processed.keys().next().value!);
    e.processed.set(key, p);
  }
  return p;
}
