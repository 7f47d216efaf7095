/**
 * Width of each peak at `relHeight` of its prominence below the top, with linear interpolation
 * between samples (in samples, not x units). Same algorithm as scipy.signal.peak_widths; with
 * relHeight 0.5 it is the full width at half prominence.
 */
export function peakWidths(
  y: ArrayLike<number>,
  peaks: ArrayLike<number>,
  prominences: ArrayLike<number>,
  leftBases: ArrayLike<number>,
  rightBases: ArrayLike<number>,
  relHeight = 0.5,
): { widths: Float64Array; widthHeights: Float64Array; leftIps: Float64Array; rightIps: Float64Array } {
  if (!(relHeight >= 0)) throw new RangeError('relHeight must be ≥ 0');
  const k = peaks.length;
  const widths = new Float64Array(k);
  const widthHeights = new Float64Array(k);
  const leftIps = new Float64Array(k);
  const rightIps = new Float64Array(k);
  for (let p = 0; p < k; p++) {
    const peak = peaks[p]!;
    const lb = leftBases[p]!;
    const rb = rightBases[p]!;
    const height = y[peak]! - prominences[p]! * relHeight;
    widthHeights[p] = height;
    let i = peak;
    while (lb < i && height < y[i]!) i--;
    let left = i;
    if (y[i]! < height) left += (height - y[i]!) / (y[i + 1]! - y[i]!);
    i = peak;
    while (i < rb && height < y[i]!) i++;
    let right = i;
    if (y[i]! < height) right -= (height - y[i]!) / (y[i - 1]! - y[i]!);
    widths[p] = right - left;
    leftIps[p] = left;
    rightIps[p] = right;
  }
  return { widths, widthHeights, leftIps, rightIps };
}
