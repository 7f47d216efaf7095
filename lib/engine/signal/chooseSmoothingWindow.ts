/**
 * Chooses a Savitzky–Golay window (odd, ≥ 5 points) for data on a uniform energy grid: it spans
 * about `targetSpanEv` (default 0.025 eV, a fraction of typical excitonic FWHMs of 60–150 meV;
 * common practice), widened 1.5× when the signal-to-noise ratio is below 30, and capped at a
 * quarter of the data so that features are not flattened.
 */
export function chooseSmoothingWindow(n: number, stepEv: number, options: { targetSpanEv?: number; signalToNoise?: number } = {}): number {
  if (!(n >= 5)) throw new RangeError('at least 5 points are needed');
  if (!(stepEv > 0)) throw new RangeError('stepEv must be positive');
  let span = options.targetSpanEv ?? 0.025;
  if (options.signalToNoise !== undefined && options.signalToNoise < 30) span *= 1.5;
  let w = Math.round(span / stepEv);
  if (w % 2 === 0) w += 1;
  const cap = Math.max(5, Math.floor(n / 4) | 1);
  if (w > cap) w = cap % 2 === 0 ? cap - 1 : cap;
  if (w < 5) w = 5;
  if (w > n) w = n % 2 === 0 ? n - 1 : n;
  return w;
}
