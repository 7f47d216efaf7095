/**
 * Prominence of each peak and the indices of its left and right bases, searching the whole signal
 * (no window). Same definition as scipy.signal.peak_prominences with wlen=None: walking left
 * (right) from the peak while the signal stays ≤ the peak's height, the base is the lowest point
 * met (the one nearest the peak on ties); prominence = height − max(left min, right min).
 * Computed for all peaks together in O(n) with a monotonic stack (nearest higher point on each
 * side, with the minimum of the stretch in between carried along), instead of one walk per peak.
 */
export function peakProminences(
  y: ArrayLike<number>,
  peaks: ArrayLike<number>,
): { prominences: Float64Array; leftBases: Int32Array; rightBases: Int32Array } {
  const n = y.length;
  const k = peaks.length;
  for (let p = 0; p < k; p++) {
    const peak = peaks[p]!;
    if (!(peak >= 0 && peak < n) || !Number.isInteger(peak)) throw new RangeError(`peak ${peak} is not a valid index`);
  }
  const prominences = new Float64Array(k);
  const leftBases = new Int32Array(k);
  const rightBases = new Int32Array(k);
  if (k === 0) return { prominences, leftBases, rightBases };
  const yy = y instanceof Float64Array ? y : Float64Array.from(y);
  if (work.stack.length < n) work = makeWork(n);
  const { leftMin, leftArg, rightMin, rightArg, stack } = work;
  sweep(yy, n, 1, leftMin, leftArg, stack);
  sweep(yy, n, -1, rightMin, rightArg, stack);
  for (let p = 0; p < k; p++) {
    const peak = peaks[p]!;
    prominences[p] = y[peak]! - Math.max(leftMin[peak]!, rightMin[peak]!);
    leftBases[p] = leftArg[peak]!;
    rightBases[p] = rightArg[peak]!;
  }
  return { prominences, leftBases, rightBases };
}

/**
 * For every index i, the minimum (and its index, nearest to i on ties) of y over the stretch from
 * i back to (not including) the nearest earlier point higher than y[i]; "earlier" is to the left
 * for dir = 1, to the right for dir = −1. Each index is pushed and popped once.
 */
function sweep(y: Float64Array, n: number, dir: 1 | -1, segMin: Float64Array, segArg: Int32Array, stack: Int32Array): void {
  let top = 0;
  for (let s = 0, i = dir === 1 ? 0 : n - 1; s < n; s++, i += dir) {
    const h = y[i]!;
    let m = h;
    let a = i;
    // popped segments come nearest-first; only a strictly lower value replaces (ties stay nearest)
    while (top > 0 && y[stack[top - 1]!]! <= h) {
      const j = stack[--top]!;
      if (segMin[j]! < m) {
        m = segMin[j]!;
        a = segArg[j]!;
      }
    }
    segMin[i] = m;
    segArg[i] = a;
    stack[top++] = i;
  }
}

// Work arrays reused between calls (single-threaded; only per-peak results leave a call).
function makeWork(n: number) {
  return {
    leftMin: new Float64Array(n),
    leftArg: new Int32Array(n),
    rightMin: new Float64Array(n),
    rightArg: new Int32Array(n),
    stack: new Int32Array(n),
  };
}
let work = makeWork(0);
