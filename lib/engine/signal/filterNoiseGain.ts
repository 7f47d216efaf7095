/**
 * Standard deviation gain of a linear filter on independent noise: √(Σ w²). The smoothed
 * (or differentiated) noise is σ·gain (÷ stepᵈ for a derivative).
 */
export function filterNoiseGain(weights: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < weights.length; i++) s += weights[i]! * weights[i]!;
  return Math.sqrt(s);
}
