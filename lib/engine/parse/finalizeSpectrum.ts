import { SpectrumFileError } from '../errors';

/**
 * Checks X and Y (finite, enough points, monotonic X, positive X where the unit needs it),
 * sorts ascending and averages Y over duplicated X values. Returns new arrays; the inputs are not
 * modified. `lineOf(i)` maps a point index to its file line for messages (may return undefined).
 */
export function finalizeSpectrum(
  fileName: string,
  xIn: ArrayLike<number>,
  yIn: ArrayLike<number>,
  options: { minPoints: number; requirePositiveX: boolean; columnName: string; lineOf?: (i: number) => number | undefined },
): { x: Float64Array; y: Float64Array; order: 'ascending' | 'descending'; warnings: string[] } {
  const n = xIn.length;
  const warnings: string[] = [];
  const at = (i: number) => {
    const line = options.lineOf?.(i);
    return line === undefined ? {} : { line };
  };
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(xIn[i]!)) throw new SpectrumFileError(fileName, 'X value is not finite', { ...at(i), column: 'X' });
    if (!Number.isFinite(yIn[i]!)) {
      throw new SpectrumFileError(fileName, 'Y value is not finite', { ...at(i), column: options.columnName });
    }
    if (options.requirePositiveX && xIn[i]! <= 0) {
      throw new SpectrumFileError(fileName, `X value ${xIn[i]} is not positive, so it cannot be converted to energy`, {
        ...at(i),
        column: 'X',
      });
    }
  }
  if (n < options.minPoints) {
    throw new SpectrumFileError(fileName, `only ${n} data points, at least ${options.minPoints} are needed`);
  }
  let up = 0;
  let down = 0;
  for (let i = 1; i < n; i++) {
    if (xIn[i]! > xIn[i - 1]!) up++;
    else if (xIn[i]! < xIn[i - 1]!) down++;
  }
  if (up > 0 && down > 0) {
    // find first reversal for the message
    const ascending = up >= down;
    let bad = 1;
    for (let i = 1; i < n; i++) {
      if (ascending ? xIn[i]! < xIn[i - 1]! : xIn[i]! > xIn[i - 1]!) {
        bad = i;
        break;
      }
    }
    throw new SpectrumFileError(
      fileName,
      `X is not monotonic (it turns back at ${xIn[bad]} after ${xIn[bad - 1]}), so it cannot be made into one axis`,
      { ...at(bad), column: 'X' },
    );
  }
  if (up === 0 && down === 0) throw new SpectrumFileError(fileName, 'all X values are equal');
  const order: 'ascending' | 'descending' = down > 0 ? 'descending' : 'ascending';
  // ascending copy
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j = order === 'ascending' ? i : n - 1 - i;
    xs[i] = xIn[j]!;
    ys[i] = yIn[j]!;
  }
  // merge duplicates
  let m = 0;
  let dupes = 0;
  for (let i = 0; i < n;) {
    let j = i + 1;
    let sum = ys[i]!;
    while (j < n && xs[j] === xs[i]) {
      sum += ys[j]!;
      j++;
    }
    if (j - i > 1) dupes += j - i - 1;
    xs[m] = xs[i]!;
    ys[m] = sum / (j - i);
    m++;
    i = j;
  }
  if (dupes > 0) warnings.push(`${dupes} duplicated X value(s) found; their Y values were averaged`);
  if (m < options.minPoints) {
    throw new SpectrumFileError(fileName, `only ${m} distinct X values, at least ${options.minPoints} are needed`);
  }
  return { x: xs.slice(0, m), y: ys.slice(0, m), order, warnings };
}
