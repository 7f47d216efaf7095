import type { DepletionComposition, DepletionRowInput } from "@/lib/fits/depletionComposition";

const f = (v: number, digits: number) => v.toFixed(digits);

function verdict({ result }: DepletionComposition): string {
  if (result.constant) return "constant: a definite composition";
  const steady =
    result.meanBoundRatio !== null &&
    result.sdBoundRatio !== null &&
    result.meanBoundRatio > 0 &&
    result.sdBoundRatio / result.meanBoundRatio <= 0.1;
  return steady
    ? "steady within 10 %, but the feed ratio changed less than 2-fold: too narrow a range to call it a definite composition"
    : "not constant within 10 %";
}

/** Each point's shares, what is left and bound of each dot, and whether the bound ratio stays constant. */
export function CompositionTable({ rows, composition }: { rows: DepletionRowInput[]; composition: DepletionComposition }) {
  const { result, separated } = composition;
  return (
    <div className="mt-3 text-sm">
      <div className="overflow-x-auto">
        <table className="w-full tabular text-sm" data-testid="depletion-composition">
          <thead className="text-left text-xs text-ink-soft">
            <tr>
              <th>point</th>
              <th>feed X:A</th>
              <th>A&apos;s absorbance</th>
              <th>X&apos;s absorbance</th>
              <th>left A (µM)</th>
              <th>left X (µM)</th>
              <th>bound A (µM)</th>
              <th>bound X (µM)</th>
              <th>bound X:A</th>
            </tr>
          </thead>
          <tbody>
            {result.rows.map((r, i) => (
              <tr key={rows[i]!.label} className="border-t border-stone-100">
                <td className="max-w-48 truncate" title={rows[i]!.label}>
                  {rows[i]!.label}
                </td>
                <td>{f(r.feedRatio, 2)}</td>
                <td>{f(separated[i]!.a, 4)}</td>
                <td>{f(separated[i]!.x, 4)}</td>
                <td>{f(r.leftA, 3)}</td>
                <td>{f(r.leftX, 3)}</td>
                <td>{f(r.boundA, 3)}</td>
                <td>{f(r.boundX, 3)}</td>
                <td>{r.boundRatio === null ? "—" : f(r.boundRatio, 2)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2" data-testid="depletion-summary">
        Bound ratio X:A {result.meanBoundRatio === null ? "—" : result.meanBoundRatio.toFixed(2)}
        {result.sdBoundRatio !== null && ` ± ${result.sdBoundRatio.toFixed(2)} (sd)`} while the feed ratio changed{" "}
        {result.feedFoldChange.toFixed(1)}-fold: <strong>{verdict(composition)}</strong>
      </p>
      {[
        ...result.warnings,
        ...composition.extinctionA.warnings.map((w) => `Dot A: ${w}`),
        ...composition.extinctionX.warnings.map((w) => `Dot X: ${w}`),
      ].map((w) => (
        <p key={w} className="text-xs text-caution">
          {w}
        </p>
      ))}
    </div>
  );
}
