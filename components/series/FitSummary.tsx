import { countOf, formatWithUncertainty, perUnit, reciprocalUnit } from "@/lib/format/quantity";
import type { SeriesFits } from "@/lib/series/analyseSeries";

/** value ± error, both rounded at the error's second significant digit (scaled, e.g. ×100 for %). */
const pm = (value: number, se: number, scale = 1, unitText = "") => formatWithUncertainty(value * scale, se * scale, unitText);

/** The series' fits with their standard errors, R² and method. */
export function FitSummary({ fits, unit }: { fits: SeriesFits; unit: string }) {
  const s = fits.saturation;
  const sv = fits.sternVolmer;
  // A fit that does not apply to this series (nothing of its kind measured) is left out.
  const showSaturation = s.fit !== null || !s.reason.startsWith("No ");
  const showSternVolmer = sv.fit !== null || !sv.reason.startsWith("No ");
  if (!showSaturation && !showSternVolmer)
    return <p className="text-sm text-ink-soft">No bleach or PL quench was measured in this series, so there is nothing to fit yet.</p>;
  return (
    <div className="grid gap-4 md:grid-cols-2">
      {showSaturation && (
        <section className="rounded-lg border border-stone-200 bg-white p-4" data-testid="fit-saturation">
          <h2 className="mb-2 text-sm font-semibold text-ink-soft">Bleach saturation (two-line fit)</h2>
          {s.fit ? (
            <>
              <p className="text-lg">
                <span className="tabular font-semibold">{pm(s.fit.breakpoint, s.fit.breakpointSe, 1, unit)}</span> at saturation
              </p>
              <dl className="mt-2 grid grid-cols-[10rem_1fr] gap-y-1 text-sm tabular">
                <dt className="text-ink-soft">Plateau bleach</dt>
                <dd>{pm(s.fit.plateau, s.fit.plateauSe, 100, "%")}</dd>
                <dt className="text-ink-soft">Rise</dt>
                <dd>{pm(s.fit.slope, s.fit.slopeSe, 100, `% ${perUnit(unit)}`)}</dd>
                <dt className="text-ink-soft">R²</dt>
                <dd>
                  {s.fit.r2.toFixed(4)} ({countOf(s.points, "point")})
                </dd>
              </dl>
              <p className="mt-2 text-xs text-ink-soft">
                The ratio at which the bleach stops growing is the product&apos;s stoichiometry. Least squares of a linear rise and a
                plateau over the breakpoint; ± is one standard error from the fit covariance (segmented regression, Hudson 1966).
              </p>
            </>
          ) : (
            <p className="text-sm text-ink-soft">{s.reason}</p>
          )}
        </section>
      )}
      {showSternVolmer && (
        <section className="rounded-lg border border-stone-200 bg-white p-4" data-testid="fit-stern-volmer">
          <h2 className="mb-2 text-sm font-semibold text-ink-soft">PL quench (Stern–Volmer)</h2>
          {sv.fit ? (
            <>
              <p className="text-lg">
                K<sub>SV</sub> = <span className="tabular font-semibold">{pm(sv.fit.ksv, sv.fit.ksvSe, 1, reciprocalUnit(unit))}</span>
              </p>
              <dl className="mt-2 grid grid-cols-[10rem_1fr] gap-y-1 text-sm tabular">
                <dt className="text-ink-soft">Intercept (ideally 1)</dt>
                <dd>{pm(sv.fit.intercept, sv.fit.interceptSe)}</dd>
                <dt className="text-ink-soft">R²</dt>
                <dd>
                  {sv.fit.r2.toFixed(4)} ({countOf(sv.points, "point")})
                </dd>
              </dl>
              <p className="mt-2 text-xs text-ink-soft">
                F₀/F = 1/(1 − quench fraction) against the variable, fitted by least squares: F₀/F = 1 + K<sub>SV</sub>[Q] (Lakowicz,
                Principles of Fluorescence Spectroscopy, 3rd ed., ch. 8; IUPAC Gold Book). ± is one standard error; spectra whose quench
                stayed under the flag threshold have no measured quench and are left out.
              </p>
            </>
          ) : (
            <p className="text-sm text-ink-soft">{sv.reason}</p>
          )}
        </section>
      )}
    </div>
  );
}
