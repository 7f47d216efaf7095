/**
 * Prominence of each peak and the indices of its left and right bases, searching the whole signal
 * (no window). Same definition as scipy.signal.peak_prominences with wlen=None.
 */
export function peakProminences(
  y: ArrayLike<number>,
  peaks: ArrayLike<number>,
): { prominences: Float64Array; leftBases: Int32Array; rightBases: Int32Array } {
  const n = y.length;
  const k = peaks.length;
  const prominences = new Float64Array(k);
  const leftBases = new Int32Array(k);
  const rightBases = new Int32Array(k);
  for (let p = 0; p < k; p++) {
    const peak = peaks[p]!;
    if (!(peak >= 0 && peak < n) || !Number.isInteger(peak)) throw new RangeError(`peak ${peak} is not a valid index`);
    const h = y[peak]!;
    let i = peak;
    let leftMin = h;
    let leftBase = peak;
    while (i >= 0 && y[i]! <= h) {
      if (y[i]! < leftMin) {
        leftMin = y[i]!;
        leftBase = i;
      }
      i--;
    }
    i = peak;
    let rightMin = h;
    let rightBase = peak;
    while (i <= n - 1 && y[i]! <= h) {
      if (y[i]! < rightMin) {
        rightMin = y[i]!;
        rightBase = i;
      }
      i++;
    }
    prominences[p] = h - Math.max(leftMin, rightMin);
    leftBases[p] = leftBase;
    rightBases[p] = rightBase;
  }
  return { prominences, leftBases, rightBases };
}
