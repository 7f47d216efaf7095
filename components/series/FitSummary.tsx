import type { SeriesFits } from "@/lib/series/analyseSeries";

/** value ± error, both rounded at the error's second significant digit. */
function pm(value: number, se: number, scale = 1): string {
  const v = value * scale, e = se * scale;
  if (!(e > 0) || !Number.isFinite(e)) return `${v.toPrecision(4)} ± ${Number.isFinite(e) ? e.toPrecision(2) : "?"}`;
  const digits = Math.min(8, Math.max(0, 1 - Math.floor(Math.log10(e))));
  return `${v.toFixed(digits)} ± ${e.toFixed(digits)}`;
}

/** The series' fits with their standard errors, R² and method. */
export function FitSummary({ fits, unit }: { fits: SeriesFits; unit: string }) {
  const u = unit ? ` ${unit}` : "";
  const s = fits.saturation;
  const sv = fits.sternVolmer;
  // A fit that does not apply to this series (nothing of its kind measured) is left out.
  const showSaturation = s.fit !== null || !s.reason.startsWith("No ");
  const showSternVolmer = sv.fit !== null || !sv.reason.startsWith("No ");
  if (!showSaturation && !showSternVolmer) return <p className="text-sm text-ink-soft">No bleach or PL quench was measured in this series, so there is nothing to fit yet.</p>;
  return (
    <div className="grid gap-4 md:grid-cols-2">
      {showSaturation && <section className="rounded-lg border border-stone-200 bg-white p-4" data-testid="fit-saturation">
        <h2 className="mb-2 text-sm font-semibold text-ink-soft">Bleach saturation (two-line fit)</h2>
        {s.fit ? (
          <>
            <p className="text-lg"><span className="tabular font-semibold">{pm(s.fit.breakpoint, s.fit.breakpointSe)}</span>{u} at saturation</p>
            <dl className="mt-2 grid grid-cols-[10rem_1fr] gap-y-1 text-sm tabular">
              <dt className="text-ink-soft">Plateau bleach</dt><dd>{pm(s.fit.plateau, s.fit.plateauSe, 100)} %</dd>
              <dt className="text-ink-soft">Rise</dt><dd>{pm(s.fit.slope, s.fit.slopeSe, 100)} % per{u || " unit"}</dd>
              <dt className="text-ink-soft">R²</dt><dd>{s.fit.r2.toFixed(4)} ({s.points} points)</dd>
            </dl>
            <p className="mt-2 text-xs text-ink-soft">The ratio at which the bleach stops growing is the product&apos;s stoichiometry. Least squares of a linear rise and a plateau over the breakpoint; ± is one standard error from the fit covariance (segmented regression, Hudson 1966).</p>
          </>
        ) : <p className="text-sm text-ink-soft">{s.reason}</p>}
      </section>}
      {showSternVolmer && <section className="rounded-lg border border-stone-200 bg-white p-4" data-testid="fit-stern-volmer">
        <h2 className="mb-2 text-sm font-semibold text-ink-soft">PL quench (Stern–Volmer)</h2>
        {sv.fit ? (
          <>
            <p className="text-lg">K<sub>SV</sub> = <span className="tabular font-semibold">{pm(sv.fit.ksv, sv.fit.ksvSe)}</span>{unit ? ` ${unit}⁻¹` : ""}</p>
            <dl className="mt-2 grid grid-cols-[10rem_1fr] gap-y-1 text-sm tabular">
              <dt className="text-ink-soft">Intercept (ideally 1)</dt><dd>{pm(sv.fit.intercept, sv.fit.interceptSe)}</dd>
              <dt className="text-ink-soft">R²</dt><dd>{sv.fit.r2.toFixed(4)} ({sv.points} points)</dd>
            </dl>
            <p className="mt-2 text-xs text-ink-soft">F₀/F = 1/(1 − quench fraction) against the variable, fitted by least squares: F₀/F = 1 + K<sub>SV</sub>[Q] (IUPAC Gold Book). ± is one standard error.</p>
          </>
        ) : <p className="text-sm text-ink-soft">{sv.reason}</p>}
      </section>}
    </div>
  );
}
