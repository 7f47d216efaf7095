import { HC_EV_NM } from '../constants';
import type { ProcessedSpectrum } from '../processSpectrum';
import type { AnalysisThresholds, FlagReport, NormalizationReport, Technique } from '../types';
import { SYSTEMATIC_RELATIVE } from './compareSpectra';
import { fitConcentration, MAX_SCALE_INFLATION, type BackgroundTerm, type ConcentrationFit } from './fitConcentration';

/**
 * Continuum used for the concentration: energies at least max(0.5 eV, 4·FWHM) above the first
 * exciton, where absorbance tracks the number of dots rather than their size (for CdSe with its
 * first exciton near 2.1–2.2 eV this starts near 460 nm and runs into the 350–400 nm region used
 * for concentrations; Yu et al. 2003, Leatherdale et al. 2002, citations from memory). The
 * transparent region at least max(0.1 eV, 2·FWHM) below it pins the background (common practice).
 */
export const CONTINUUM_OFFSET_EV = 0.5;
export const TRANSPARENT_OFFSET_EV = 0.1;
const MIN_REGION_POINTS = 16;
/** A fitted ratio less certain than this (relative) is not applied (common practice). */
const MAX_RELATIVE_UNCERTAINTY = 0.1;

export interface AutoNormalization {
  fit: ConcentrationFit | null;
  details: NormalizationReport;
  flag: FlagReport | null;
}

const none = (reason: string, scaleDetermined = true, separation: NormalizationReport['separation'] = null): AutoNormalization => ({
  fit: null,
  flag: null,
  details: {
    requested: 'auto',
    applied: 'none',
    factor: 1,
    concentrationRatio: 1,
    concentrationRatioUncertainty: null,
    background: null,
    regionsEv: [],
    separation,
    scaleDetermined,
    reason,
  },
});

const TERM_WORDS: Record<BackgroundTerm, string> = {
  slope: 'baseline slope',
  scatter: 'scattering tail',
  shift: 'shift of the continuum',
};

/** Why a withheld scale matters, and what the caller can do (said once, in every refusal). */
const WITHHELD =
  'bleach and new-band flags, whose size depends on the ratio, are withheld (give --normalize wavelength:NM or concentration:S/R)';

/**
 * 'auto' normalisation: for absorption, the reference is fitted to the sample (scale k and a smooth
 * background; fitConcentration) on the band-free regions placed from the reference's first
 * exciton, and k is reported as a concentration ratio (flag kind `concentration`, never a bleach)
 * when |k − 1| ≥ minConcentrationChange and it is significant. PL and mid-IR are not scaled (said
 * why). `sample` is the sample on the grid as measured; `clipWindow` the derivative window.
 */
export function autoNormalization(
  technique: Technique,
  energy: Float64Array,
  sample: Float64Array,
  r: ProcessedSpectrum,
  sigmaSample: number,
  clipWindow: number,
  t: AnalysisThresholds,
): AutoNormalization {
  if (technique === 'pl') {
    return none(
      'not scaled: for emission the intensity is what a quench changes; give the absorbances to compare emission per absorbed photon',
    );
  }
  if (technique === 'ir') return none('not scaled: the mid-IR has no band-free continuum to scale on; bands are compared by their ratio');
  const fx = r.firstExciton;
  if (!fx) return none('not scaled: the reference has no first exciton to place the band-free continuum from');
  const f = (fx.fwhmMeV ?? 100) / 1000;
  const n = energy.length;
  const contFrom = fx.energyEv + Math.max(CONTINUUM_OFFSET_EV, 4 * f);
  const gapTo = fx.energyEv - Math.max(TRANSPARENT_OFFSET_EV, 2 * f);
  const mask = new Uint8Array(n);
  let cont = 0;
  let gap = 0;
  for (let i = 0; i < n; i++) {
    const e = energy[i]!;
    if (e >= contFrom) {
      mask[i] = 1;
      cont++;
    } else if (e <= gapTo) gap++;
  }
  if (cont < MIN_REGION_POINTS) {
    return none(
      `not scaled: the data reach ${(HC_EV_NM / energy[n - 1]!).toFixed(0)} nm, less than ${Math.max(CONTINUUM_OFFSET_EV, 4 * f).toFixed(2)} eV above the first exciton: no continuum to scale on; ${WITHHELD}`,
      false,
    );
  }
  const withGap = gap >= MIN_REGION_POINTS;
  const clippable = new Uint8Array(n);
  if (withGap) {
    for (let i = 0; i < n; i++)
      if (energy[i]! <= gapTo) {
        mask[i] = 1;
        clippable[i] = 1;
      }
  }
  const fit = fitConcentration(energy, sample, r.smoothed, r.firstDerivative, mask, {
    sigmaSample,
    sigmaReference: r.sigmaSmoothed,
    clipWindow,
    allowSlopeAndScatter: withGap,
    clippable,
  });
  if (!fit) return none(`not scaled: the concentration fit failed (too few usable points or a non-positive scale); ${WITHHELD}`, false);
  const separation = {
    scaleInflation: fit.scaleInflation,
    maxScaleInflation: MAX_SCALE_INFLATION,
    terms: fit.terms,
    droppedTerms: fit.dropped,
  };
  // A ratio the background terms can imitate is used only when it is still so precise that a 5σ
  // error of it stays below the smallest bleach flagged: σ_k/k ≤ minBleachFraction/minSignificance
  // (1 % with the defaults). Otherwise a trade of scale against background could itself make a flag.
  const maxTradedRelative = t.minBleachFraction / Math.max(t.minSignificance, 1);
  const termList = (terms: BackgroundTerm[]) => terms.map((d) => TERM_WORDS[d]).join(' and ');
  if (fit.degenerate && fit.sigmaRatio > maxTradedRelative * fit.ratio) {
    return none(
      `not scaled: on these data the concentration ratio cannot be told from the ${termList(fit.degenerate.terms)} that the fit needs (variance of the ratio inflated ${fit.degenerate.inflation.toFixed(0)}×, more than ${MAX_SCALE_INFLATION}×, and the ratio ${fit.ratio.toFixed(3)} ± ${fit.sigmaRatio.toFixed(3)} is less precise than ±${(100 * maxTradedRelative).toFixed(0)} %); ${WITHHELD}`,
      false,
      separation,
    );
  }
  if (fit.sigmaRatio > MAX_RELATIVE_UNCERTAINTY * fit.ratio) {
    return none(
      `not scaled: the concentration ratio ${fit.ratio.toFixed(2)} ± ${fit.sigmaRatio.toFixed(2)} is too uncertain to use (noise or too short a continuum); ${WITHHELD}`,
      false,
      separation,
    );
  }
  const k = fit.ratio;
  const sigmaK = Math.sqrt(fit.sigmaRatio ** 2 + 2 * (SYSTEMATIC_RELATIVE * k) ** 2);
  const regionsEv: Array<[number, number]> = [[contFrom, energy[n - 1]!]];
  if (withGap) regionsEv.unshift([energy[0]!, gapTo]);
  const bgTerms = [
    'offset',
    ...(fit.terms.includes('slope') ? ['slope'] : []),
    ...(fit.scatterPower !== null ? [`scattering ∝ E^${fit.scatterPower} (λ^−${fit.scatterPower})`] : []),
  ];
  const bg = bgTerms.length > 1 ? `${bgTerms.slice(0, -1).join(', ')} and ${bgTerms[bgTerms.length - 1]}` : bgTerms[0]!;
  const droppedNote =
    (fit.dropped.length > 0
      ? `; ${termList(fit.dropped)} left out of the model: these data cannot tell ${fit.dropped.length > 1 ? 'them' : 'it'} from the scale and do not need ${fit.dropped.length > 1 ? 'them' : 'it'}`
      : '') +
    (fit.degenerate
      ? `; the ${termList(fit.degenerate.terms)} inflate${fit.degenerate.terms.length > 1 ? '' : 's'} the ratio's variance ${fit.scaleInflation.toFixed(0)}× (more than ${MAX_SCALE_INFLATION}×), but the ratio is still known to ±${((100 * fit.sigmaRatio) / fit.ratio).toFixed(1)} % (within ±${(100 * maxTradedRelative).toFixed(0)} %), and its uncertainty is carried into every flag`
      : fit.dropped.length > 0
        ? ` (variance inflation of the ratio now ${fit.scaleInflation.toFixed(1)}, at most ${MAX_SCALE_INFLATION})`
        : '');
  const details: NormalizationReport = {
    requested: 'auto',
    applied: 'fit',
    factor: 1 / k,
    concentrationRatio: k,
    concentrationRatioUncertainty: sigmaK,
    background: { offset: fit.offset, slope: fit.slope, centreEv: fit.centreEv, scatter: fit.scatter, scatterPower: fit.scatterPower },
    regionsEv,
    separation,
    scaleDetermined: true,
    reason:
      `reference fitted to the sample on the continuum above ${contFrom.toFixed(2)} eV (${(HC_EV_NM / contFrom).toFixed(0)} nm), where absorbance tracks the number of dots` +
      (withGap ? ` and the transparent region below ${gapTo.toFixed(2)} eV` : '') +
      `, with a smooth background (${bg}); the sample is compared after subtracting the background and dividing by the ratio` +
      droppedNote +
      (fit.clipped > 0 ? `; ${fit.clipped} points with local structure left out of the fit` : ''),
  };
  const change = k - 1;
  const sig = sigmaK > 0 ? Math.abs(change) / sigmaK : 0;
  const flag: FlagReport | null =
    Math.abs(change) >= t.minConcentrationChange && sig >= t.minSignificance
      ? {
          kind: 'concentration',
          energyEv: null,
          wavelengthNm: null,
          fraction: null,
          shiftMeV: null,
          fwhmChangeMeV: null,
          magnitude: k,
          unit: 'ratio',
          uncertainty: sigmaK,
          significance: sig,
          message: `concentration ratio ${k.toFixed(2)} ± ${sigmaK.toFixed(2)} (sample/reference), from the continuum above ${contFrom.toFixed(2)} eV; bands compared after scaling`,
        }
      : null;
  return { fit, details, flag };
}
