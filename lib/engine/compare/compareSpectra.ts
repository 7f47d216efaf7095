import { CM1_PER_EV, HC_EV_NM } from '../constants';
import { savitzkyGolayNoiseGain } from '../signal/savitzkyGolayWeights';
import type { ProcessedSpectrum } from '../processSpectrum';
import type { AnalysisThresholds, FlagReport, Technique } from '../types';
import { findLocalMaxima } from '../peaks/findLocalMaxima';
import { peakProminences } from '../peaks/peakProminences';
import { fitShiftBroadening } from './fitShiftBroadening';
import { peakWidths } from '../peaks/peakWidths';
import { emissionPerAbsorbedPhoton } from '../derived/emissionPerAbsorbedPhoton';
import { atmosphericBandsInRange, type AtmosphericBandReport } from './atmosphericBands';

/** Mid-IR upper edge for an intraband candidate: 4000 cm⁻¹ ≈ 0.496 eV (common practice). */
export const MID_IR_MAX_EV = 0.496;

/**
 * Smallest FWHM of a new mid-IR band offered as an intraband (1Se–1Pe) candidate: 100 cm⁻¹. The
 * intraband absorption of n-doped dots is broad, typically hundreds of cm⁻¹ (Shim &
 * Guyot-Sionnest, Nature 2000, 407, 981; from memory), while vibrational bands of ligands and
 * residues are tens of cm⁻¹ or narrower (common practice).
 */
export const MIN_INTRABAND_FWHM_CM1 = 100;

/**
 * Relative systematic standard uncertainty of a measured signal (photometric accuracy, baseline,
 * cuvette and concentration repeatability): 0.5 % (common practice). Added in quadrature to the
 * noise part of fractional quantities (bleach, PL quench) and of new-band heights, so that very
 * clean instrument files cannot make a tiny change hundreds of "σ" significant.
 */
export const SYSTEMATIC_RELATIVE = 0.005;

export interface CompareOptions {
  technique: Technique;
  thresholds: AnalysisThresholds;
  excitationNm?: number | undefined;
  sampleAbsorbanceAtExcitation?: number | undefined;
  referenceAbsorbanceAtExcitation?: number | undefined;
  sampleAbsorbanceAtEmission?: number | undefined;
  referenceAbsorbanceAtEmission?: number | undefined;
  sampleDotsAbsorbanceAtExcitation?: number | undefined;
  referenceDotsAbsorbanceAtExcitation?: number | undefined;
  forceInnerFilterCorrection?: boolean | undefined;
  /** Relative standard uncertainty of the concentration scaling applied to the sample (0 when none was fitted). */
  scaleRelativeUncertainty?: number | undefined;
  /**
   * The concentration ratio was asked for ('auto') but could not be determined: bleach and new-band
   * flags, whose size depends on it, are not raised (shift and broadening carry their own amplitude).
   */
  scaleUndetermined?: boolean | undefined;
}

export interface ComparisonResult {
  flags: FlagReport[];
  warnings: string[];
  /** Mid-IR: atmospheric bands inside the range, masked before any band flag. */
  atmosphericBands: AtmosphericBandReport[];
}

function interpAt(e: Float64Array, y: Float64Array, x: number): number {
  const n = e.length;
  const step = (e[n - 1]! - e[0]!) / (n - 1);
  const t = (x - e[0]!) / step;
  const j = Math.min(Math.max(Math.floor(t), 0), n - 2);
  const f = t - j;
  return y[j]! + f * (y[j + 1]! - y[j]!);
}

/**
 * Compares a sample with its parent reference on the same uniform energy grid (both already
 * processed with the same smoothing). Produces bleach, new-band, shift, broadening and PL-quench
 * flags, each with a magnitude, its standard uncertainty from the noise estimates, and the
 * significance |magnitude|/uncertainty. A flag needs both its magnitude threshold and the
 * significance threshold.
 */
export function compareSpectra(s: ProcessedSpectrum, r: ProcessedSpectrum, o: CompareOptions): ComparisonResult {
  const t = o.thresholds;
  const scaleRel = o.scaleRelativeUncertainty ?? 0;
  const flags: FlagReport[] = [];
  const warnings: string[] = [];
  const n = s.energy.length;
  const E = s.energy;
  const sigmaDiffRaw = Math.sqrt(s.sigma ** 2 + r.sigma ** 2);
  const fx = r.firstExciton;
  const guard = (s.windowSize - 1) / 2;

  // ---- shift and broadening around the reference's first exciton (or main band)
  let fit: ReturnType<typeof fitShiftBroadening> = null;
  let fitRange: [number, number] | null = null;
  let explain: ReturnType<typeof fitShiftBroadening> = null;
  if (fx && fx.fwhmMeV) {
    // the window follows the band's width: ±1.5 FWHM for an emission band; for absorption the
    // high-energy side stops at +0.5 FWHM, where the next transitions start to overlap (common practice)
    const below = Math.max(1.5 * (fx.fwhmMeV / 1000), 6 * s.step);
    const above = Math.max((o.technique === 'absorption' ? 0.5 : 1.5) * (fx.fwhmMeV / 1000), 6 * s.step);
    const from = Math.max(guard, Math.ceil((fx.energyEv - below - E[0]!) / s.step));
    const to = Math.min(n - guard, Math.floor((fx.energyEv + above - E[0]!) / s.step) + 1);
    // S − R noise: raw sample noise plus smoothed reference noise
    const sigmaFit = Math.sqrt(s.sigma ** 2 + r.sigmaSmoothed ** 2);
    // the fitted model explains differences over ±1.5 FWHM even where the fit stopped short
    const wide = Math.max(1.5 * (fx.fwhmMeV / 1000), 6 * s.step);
    const evaluate = {
      from: Math.max(guard, Math.min(from, Math.ceil((fx.energyEv - wide - E[0]!) / s.step))),
      to: Math.min(n - guard, Math.max(to, Math.floor((fx.energyEv + wide - E[0]!) / s.step) + 1)),
    };
    // refined by convolution only from half the flag threshold up (a ≥ 5 % wider line, by default)
    const f0 = fx.fwhmMeV / 1000;
    const refineAbove = ((((1 + 0.5 * t.minBroadeningFraction) * f0) ** 2 - f0 * f0) / (8 * Math.LN2)) * 0.8;
    fit = fitShiftBroadening(E, s.raw, r.smoothed, r.firstDerivative, r.secondDerivative, from, to, sigmaFit, evaluate, refineAbove);
    if (fit) fitRange = [E[fit.from]!, E[fit.to - 1]!];
    // for absorption also a symmetric ±1.5 FWHM fit, used only to explain differences (a shift of
    // the first exciton alone leaves the next transitions behind; one window cannot serve both)
    const moved =
      fit && (Math.abs(fit.shiftEv) > 2 * fit.sigmaShiftEv || Math.abs(fit.broadeningVarianceEv2) > 2 * fit.sigmaBroadeningVarianceEv2);
    if (moved && o.technique === 'absorption' && (evaluate.from < from || evaluate.to > to)) {
      explain = fitShiftBroadening(
        E,
        s.raw,
        r.smoothed,
        r.firstDerivative,
        r.secondDerivative,
        evaluate.from,
        evaluate.to,
        sigmaFit,
        evaluate,
        Infinity,
      );
    } else warnings.push('shift/broadening fit around the first exciton did not converge');
  }
  if (fit && fx) {
    const shiftMeV = fit.shiftEv * 1000;
    const sig = fit.sigmaShiftEv > 0 ? Math.abs(fit.shiftEv) / fit.sigmaShiftEv : 0;
    if (Math.abs(shiftMeV) >= t.minShiftMeV && sig >= t.minSignificance) {
      flags.push({
        kind: 'shift',
        energyEv: fx.energyEv + fit.shiftEv,
        wavelengthNm: HC_EV_NM / (fx.energyEv + fit.shiftEv),
        fraction: null,
        shiftMeV,
        fwhmChangeMeV: null,
        magnitude: shiftMeV,
        unit: 'meV',
        uncertainty: fit.sigmaShiftEv * 1000,
        significance: sig,
        bandRole: o.technique === 'pl' ? 'emission-band' : 'excitonic-transition',
        message: `${o.technique === 'pl' ? 'emission' : 'first exciton'} ${shiftMeV < 0 ? 'red' : 'blue'}-shifted by ${Math.abs(shiftMeV).toFixed(1)} meV`,
      });
    }
    const f0 = fx.fwhmMeV! / 1000;
    const inner = f0 * f0 + 8 * Math.LN2 * fit.broadeningVarianceEv2;
    const f1 = inner > 0 ? Math.sqrt(inner) : 0;
    const dF = f1 - f0;
    const sigDF = (4 * Math.LN2 * fit.sigmaBroadeningVarianceEv2) / Math.max(f1, f0);
    const sigB = sigDF > 0 ? Math.abs(dF) / sigDF : 0;
    if (Math.abs(dF) / f0 >= t.minBroadeningFraction && sigB >= t.minSignificance) {
      flags.push({
        kind: 'broadening',
        energyEv: fx.energyEv,
        wavelengthNm: fx.wavelengthNm,
        fraction: dF / f0,
        shiftMeV: null,
        fwhmChangeMeV: dF * 1000,
        magnitude: dF * 1000,
        unit: 'meV',
        uncertainty: sigDF * 1000,
        significance: sigB,
        bandRole: o.technique === 'pl' ? 'emission-band' : 'excitonic-transition',
        message: `${o.technique === 'pl' ? 'emission' : 'first-exciton'} FWHM ${dF > 0 ? 'broadened' : 'narrowed'} by ${Math.abs(dF * 1000).toFixed(1)} meV (${((100 * dF) / f0).toFixed(1)} %)`,
      });
    }
  }

  // ---- bleach at the reference's first-exciton energy (absorption), net of any shift/broadening:
  // the drop of the band after following it (fitted model without its amplitude change minus the
  // sample, at E*), so a shift's share of the drop at a fixed energy is not counted as bleach.
  if (o.scaleUndetermined) {
    warnings.push('concentration ratio not determined (see parameters.normalization.details.reason): bleach and new-band flags withheld');
  }
  if (fx && o.technique === 'absorption' && !o.scaleUndetermined) {
    const Ar = interpAt(E, r.smoothed, fx.energyEv);
    const As = interpAt(E, s.smoothed, fx.energyEv);
    if (Ar > 0) {
      const gross = (Ar - As) / Ar;
      let fraction = gross;
      if (fit) {
        const k = Math.round((fx.energyEv - E[0]!) / s.step);
        const kk = k - fit.from;
        if (kk >= 0 && kk < fit.model.length) {
          // the reference as the fit moved and broadened it, without amplitude change or offset
          const followed = fit.model[kk]! - fit.alpha * fit.base[kk]! - fit.offset;
          fraction = (followed - s.smoothed[k]!) / Ar;
        }
      }
      // noise part, 0.5 % systematic on each of A_s and A_r (SYSTEMATIC_RELATIVE), and the
      // concentration scale's own uncertainty
      const ratio = 1 - fraction;
      const sigma = Math.sqrt(
        (s.sigmaSmoothed / Ar) ** 2 +
          ((As * r.sigmaSmoothed) / (Ar * Ar)) ** 2 +
          2 * (SYSTEMATIC_RELATIVE * ratio) ** 2 +
          (scaleRel * ratio) ** 2,
      );
      const sig = sigma > 0 ? fraction / sigma : 0;
      if (fraction >= t.minBleachFraction && sig >= t.minSignificance) {
        const netOfShift = fit && Math.abs(gross - fraction) > 1e-9;
        flags.push({
          kind: 'bleach',
          energyEv: fx.energyEv,
          wavelengthNm: fx.wavelengthNm,
          fraction,
          shiftMeV: null,
          fwhmChangeMeV: null,
          magnitude: fraction,
          unit: 'fraction',
          uncertainty: sigma,
          significance: sig,
          bandRole: 'excitonic-transition',
          message: `first-exciton absorbance down ${(100 * fraction).toFixed(1)} % at ${fx.wavelengthNm.toFixed(1)} nm${netOfShift ? ` (band followed through its shift; ${(100 * gross).toFixed(1)} % at the fixed wavelength)` : ''}`,
        });
      }
    }
  }

  // ---- new bands: contiguous positive features of the difference (smoothed with the wider
  // derivative window) that neither the unshifted reference, the reference shifted by the fitted
  // δ, nor (inside the fitted window) the shift/broadening model explains. Noise wiggles on top of
  // one broad band are local maxima too: a maximum is a band of its own only when its prominence
  // (scipy.signal.peak_prominences definition) in that unexplained difference passes both the
  // significance and the magnitude threshold, so one broad band gives one flag, at its top.
  const wd = s.derivativeWindowSize;
  const sDer = s.smoothedWide;
  const rDer = r.smoothedWide;
  const gainD = savitzkyGolayNoiseGain(wd, s.polynomial, 0);
  const sigmaD = sigmaDiffRaw * gainD;
  let scale = fx ? Math.abs(interpAt(E, r.smoothed, fx.energyEv)) : 0;
  if (!(scale > 0)) for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(r.smoothed[i]!));
  const excluded = (e: number) => s.exclude.some(([lo, hi]) => e >= lo && e <= hi);
  const lo = Math.min(Math.max(guard, 0), n);
  const hi = Math.max(lo, n - guard);
  // unexplained difference on [lo, hi)
  const excess = new Float64Array(hi - lo);
  for (let i = lo; i < hi; i++) {
    let value = sDer[i]! - rDer[i]!;
    if (fit) {
      value = Math.min(value, sDer[i]! - interpAt(E, rDer, E[i]! - fit.shiftEv));
      if (fitRange && E[i]! >= fitRange[0] && E[i]! <= fitRange[1]) value = Math.min(value, s.smoothed[i]! - fit.model[i - fit.from]!);
      if (explain && i >= explain.from && i < explain.to) value = Math.min(value, s.smoothed[i]! - explain.model[i - explain.from]!);
    }
    excess[i - lo] = value;
  }
  // mid-IR: atmospheric residues masked before anything is searched for (atmosphericBands.ts)
  let atmosphericBands: AtmosphericBandReport[] = [];
  if (o.technique === 'ir') {
    const rawDiff = new Float64Array(n);
    const smoothDiff = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      rawDiff[i] = s.raw[i]! - r.raw[i]!;
      smoothDiff[i] = sDer[i]! - rDer[i]!;
    }
    atmosphericBands = atmosphericBandsInRange(E, excess, lo, rawDiff, smoothDiff, sigmaDiffRaw, sigmaD, t.minSignificance);
    for (const b of atmosphericBands) {
      if (b.present)
        warnings.push(
          `${b.name} (${b.fromCm1}–${b.toCm1} cm⁻¹) seen in the difference: atmospheric, ${b.masked ? 'masked' : 'not masked'} before band flags`,
        );
    }
  }
  // noise, 0.5 % systematic on each spectrum, and the scale's own uncertainty (the sample was divided by it)
  const uncertaintyAt = (i: number) =>
    Math.sqrt(sigmaD ** 2 + SYSTEMATIC_RELATIVE ** 2 * (sDer[i]! ** 2 + rDer[i]! ** 2) + (scaleRel * sDer[i]!) ** 2);
  // a band of the reference that grew is a changed band, not a new one (mid-IR: band-change below)
  const referenceBands = o.technique === 'ir' ? r.peaks : [];
  const hasCounterpart = (e: number) =>
    referenceBands.some((p) => Math.abs(p.energyEv - e) <= Math.max((p.fwhmMeV ?? 0) / 1000, wd * s.step));
  const candidates: FlagReport[] = [];
  const maxima = o.scaleUndetermined ? [] : findLocalMaxima(excess);
  // prominences only when some maximum passes the height thresholds (none in most noise-only pairs)
  let any = false;
  for (let k = 0; k < maxima.length && !any; k++) {
    const i = maxima[k]! + lo;
    const u = uncertaintyAt(i);
    any = excess[maxima[k]!]! >= t.minSignificance * u && excess[maxima[k]!]! / scale >= t.minNewBandFraction;
  }
  // The unexplained difference has a zero baseline, so a band cut by the end of the range is
  // measured against zero there (a zero is padded at each end): otherwise a broad band near an
  // edge would have almost no prominence and go unflagged.
  const padded = new Float64Array(excess.length + 2);
  padded.set(excess, 1);
  const {
    prominences,
    leftBases: leftPadded,
    rightBases: rightPadded,
  } = any
    ? peakProminences(
        padded,
        Int32Array.from(maxima, (m) => m + 1),
      )
    : { prominences: new Float64Array(0), leftBases: new Int32Array(0), rightBases: new Int32Array(0) };
  const clampBase = (b: number) => Math.min(Math.max(b - 1, 0), excess.length - 1);
  const leftBases = Int32Array.from(leftPadded, clampBase);
  const rightBases = Int32Array.from(rightPadded, clampBase);
  for (let k = 0; any && k < maxima.length; k++) {
    const j = maxima[k]!;
    const i = j + lo;
    if (excluded(E[i]!)) continue;
    const value = excess[j]!;
    const u = uncertaintyAt(i);
    const sig = u > 0 ? value / u : 0;
    const frac = value / scale;
    if (!(sig >= t.minSignificance && frac >= t.minNewBandFraction)) continue;
    // a band of its own: the dip separating it from any higher neighbour is itself significant
    const prom = prominences[k]!;
    if (!(prom >= t.minSignificance * u && prom / scale >= t.minNewBandFraction)) continue;
    const e = bandTop(E, excess, lo, j, leftBases[k]!, rightBases[k]!);
    if (hasCounterpart(e)) continue;
    // FWHM at half its prominence in the unexplained difference (scipy.signal.peak_widths definition)
    const wp = peakWidths(padded, [j + 1], [prom], [leftPadded[k]!], [rightPadded[k]!], 0.5).widths[0]!;
    const widthMeV = wp > 0 ? wp * s.step * 1000 : null;
    const widthCm1 = widthMeV !== null ? (widthMeV / 1000) * CM1_PER_EV : null;
    const intraband = o.technique === 'ir' && e <= MID_IR_MAX_EV && widthCm1 !== null && widthCm1 >= MIN_INTRABAND_FWHM_CM1;
    const where = `${e.toFixed(3)} eV (${(HC_EV_NM / e).toFixed(0)} nm, ${(e * CM1_PER_EV).toFixed(0)} cm⁻¹)`;
    const wide = widthCm1 !== null ? `, FWHM ${o.technique === 'ir' ? `${widthCm1.toFixed(0)} cm⁻¹` : `${widthMeV!.toFixed(0)} meV`}` : '';
    candidates.push({
      kind: 'new-band',
      energyEv: e,
      wavelengthNm: HC_EV_NM / e,
      fraction: frac,
      shiftMeV: null,
      fwhmChangeMeV: null,
      magnitude: value,
      unit: 'signal',
      uncertainty: u,
      significance: sig,
      intraband,
      widthMeV,
      ...(o.technique === 'ir'
        ? { bandRole: intraband ? ('intraband-candidate' as const) : ('vibrational-band' as const) }
        : o.technique === 'pl'
          ? { bandRole: 'emission-band' as const }
          : {}),
      message:
        o.technique === 'ir'
          ? `new ${intraband ? 'broad ' : ''}band at ${(e * CM1_PER_EV).toFixed(0)} cm⁻¹ (${e.toFixed(3)} eV)${wide}, with no counterpart in the reference${intraband ? ': intraband candidate' : ''}`
          : `new ${o.technique === 'pl' ? 'emission ' : ''}band at ${where}${wide}`,
    });
  }
  // one flag per band: the strongest candidate within ± one derivative window
  candidates.sort((a, b) => b.magnitude - a.magnitude);
  const kept: FlagReport[] = [];
  for (const c of candidates) {
    if (!kept.some((k) => Math.abs(k.energyEv! - c.energyEv!) <= wd * s.step)) kept.push(c);
  }
  kept.sort((a, b) => a.energyEv! - b.energyEv!);
  flags.push(...kept);

  // ---- mid-IR: bands of the reference that grew or shrank (ratio of the band tops)
  if (o.technique === 'ir') {
    const masked = (e: number) => atmosphericBands.some((b) => b.masked && e * CM1_PER_EV >= b.fromCm1 && e * CM1_PER_EV <= b.toCm1);
    for (const p of r.peaks) {
      if (p.kind !== 'maximum' || p.index < guard || p.index >= n - guard || masked(p.energyEv)) continue;
      const Rv = r.smoothed[p.index]!;
      if (!(Rv > 0)) continue;
      // the sample's top within ± half the band's FWHM (follows a small shift)
      const reach = Math.max(1, Math.round((p.fwhmMeV ?? 0) / 1000 / 2 / s.step));
      let Sv = -Infinity;
      let at = p.index;
      for (let i = Math.max(0, p.index - reach); i <= Math.min(n - 1, p.index + reach); i++)
        if (s.smoothed[i]! > Sv) {
          Sv = s.smoothed[i]!;
          at = i;
        }
      const ratio = Sv / Rv;
      const change = ratio - 1;
      const sigma = Math.sqrt(
        (s.sigmaSmoothed / Rv) ** 2 +
          ((Sv * r.sigmaSmoothed) / (Rv * Rv)) ** 2 +
          2 * (SYSTEMATIC_RELATIVE * ratio) ** 2 +
          (scaleRel * ratio) ** 2,
      );
      const sig = sigma > 0 ? Math.abs(change) / sigma : 0;
      if (Math.abs(change) >= t.minBandChangeFraction && sig >= t.minSignificance) {
        const e = E[at]!;
        flags.push({
          kind: 'band-change',
          energyEv: e,
          wavelengthNm: HC_EV_NM / e,
          fraction: change,
          shiftMeV: null,
          fwhmChangeMeV: null,
          magnitude: change,
          unit: 'fraction',
          uncertainty: sigma,
          significance: sig,
          bandRole: 'vibrational-band',
          message: `band at ${(p.energyEv * CM1_PER_EV).toFixed(0)} cm⁻¹ ${change > 0 ? 'grew' : 'shrank'} to ${ratio.toFixed(2)}× the reference's`,
        });
      }
    }
  }

  // ---- PL quench on the energy axis
  if (o.technique === 'pl') {
    let Fs = 0;
    let Fr = 0;
    let count = 0;
    for (let i = 0; i < n; i++) {
      if (excluded(E[i]!)) continue;
      Fs += s.raw[i]!;
      Fr += r.raw[i]!;
      count++;
    }
    Fs *= s.step;
    Fr *= s.step;
    if (!o.excitationNm) warnings.push('excitation wavelength unknown: the PL integral may include the excitation/scatter line');
    // emission per photon absorbed by the dots (emissionPerAbsorbedPhoton: one inner-filter model)
    let corr = 1;
    let corrected = false;
    let notCorrected = 'not corrected for absorbance';
    if (o.sampleAbsorbanceAtExcitation !== undefined && o.referenceAbsorbanceAtExcitation !== undefined) {
      if (o.sampleAbsorbanceAtEmission === undefined || o.referenceAbsorbanceAtEmission === undefined) {
        warnings.push('absorbance at the emission band not given for both spectra: taken as 0 (no secondary inner-filter correction)');
      }
      const cs = emissionPerAbsorbedPhoton(
        {
          excitation: o.sampleAbsorbanceAtExcitation,
          emission: o.sampleAbsorbanceAtEmission ?? 0,
          dotsAtExcitation: o.sampleDotsAbsorbanceAtExcitation,
        },
        o.forceInnerFilterCorrection,
      );
      const cr = emissionPerAbsorbedPhoton(
        {
          excitation: o.referenceAbsorbanceAtExcitation,
          emission: o.referenceAbsorbanceAtEmission ?? 0,
          dotsAtExcitation: o.referenceDotsAbsorbanceAtExcitation,
        },
        o.forceInnerFilterCorrection,
      );
      if (cs.applied && cr.applied) {
        corr = cs.factor / cr.factor;
        corrected = true;
        warnings.push(...cs.warnings.map((w) => `sample: ${w}`), ...cr.warnings.map((w) => `reference: ${w}`));
      } else {
        const why = !cs.applied ? `sample: ${cs.reason}` : !cr.applied ? `reference: ${cr.reason}` : '';
        notCorrected = `not corrected for absorbance: ${why}`;
        warnings.push(`emission not corrected for absorbance (${why})`);
      }
    } else {
      warnings.push(
        'absorbances at the excitation not given: emission compared as measured, not per absorbed photon (a dilution reads as a drop)',
      );
    }
    if (Fr > 0 && count > 0) {
      const ratio = (Fs / Fr) * corr;
      const fraction = 1 - ratio;
      const sFs = s.sigma * s.step * Math.sqrt(count);
      const sFr = r.sigma * s.step * Math.sqrt(count);
      const sigma =
        Math.abs(ratio) *
        Math.sqrt((sFs / Math.max(Math.abs(Fs), 1e-300)) ** 2 + (sFr / Fr) ** 2 + 2 * SYSTEMATIC_RELATIVE ** 2 + scaleRel ** 2);
      const sig = sigma > 0 ? fraction / sigma : 0;
      if (fraction >= t.minQuenchFraction && sig >= t.minSignificance) {
        flags.push({
          kind: 'pl-quench',
          energyEv: fx ? fx.energyEv : null,
          wavelengthNm: fx ? fx.wavelengthNm : null,
          fraction,
          shiftMeV: null,
          fwhmChangeMeV: null,
          magnitude: fraction,
          unit: 'fraction',
          uncertainty: sigma,
          significance: sig,
          bandRole: 'emission-band',
          message: corrected
            ? `emission per absorbed photon down ${(100 * fraction).toFixed(1)} %`
            : `emission down ${(100 * fraction).toFixed(1)} % (${notCorrected})`,
        });
      } else if (fraction <= -t.minQuenchFraction && -sig >= t.minSignificance) {
        warnings.push(
          `integrated emission${corrected ? ' per absorbed photon' : ''} up ${(-100 * fraction).toFixed(1)} % against the reference`,
        );
      }
    } else {
      warnings.push('reference PL integral is not positive: quench not computed');
    }
  }
  return { flags, warnings, atmosphericBands };
}
/**
 * Energy of a difference band's top: vertex of a least-squares parabola through the points of
 * its peak (between its prominence bases) that lie above 80 % of the way from the higher base
 * to the top, so that noise wiggles on a broad top do not pick the position; the highest sample
 * when fewer than 5 such points exist or the fit is not a maximum inside them.
 */
function bandTop(E: Float64Array, y: Float64Array, offset: number, peak: number, left: number, right: number): number {
  const top = y[peak]!;
  const cut = Math.max(y[left]!, y[right]!) + 0.8 * (top - Math.max(y[left]!, y[right]!));
  let a = peak;
  while (a > left && y[a - 1]! >= cut) a--;
  let b = peak;
  while (b < right && y[b + 1]! >= cut) b++;
  const m = b - a + 1;
  if (m < 5) return E[peak + offset]!;
  // fit y = c0 + c1 u + c2 u² with u = index − peak
  let s0 = 0,
    s1 = 0,
    s2 = 0,
    s3 = 0,
    s4 = 0,
    t0 = 0,
    t1 = 0,
    t2 = 0;
  for (let j = a; j <= b; j++) {
    const u = j - peak;
    const u2 = u * u;
    s0 += 1;
    s1 += u;
    s2 += u2;
    s3 += u2 * u;
    s4 += u2 * u2;
    t0 += y[j]!;
    t1 += u * y[j]!;
    t2 += u2 * y[j]!;
  }
  // Cramer's rule on the 3×3 normal equations
  const det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
  if (det === 0) return E[peak + offset]!;
  const c1 = (s0 * (t1 * s4 - s3 * t2) - t0 * (s1 * s4 - s3 * s2) + s2 * (s1 * t2 - t1 * s2)) / det;
  const c2 = (s0 * (s2 * t2 - t1 * s3) - s1 * (s1 * t2 - t1 * s2) + t0 * (s1 * s3 - s2 * s2)) / det;
  if (!(c2 < 0)) return E[peak + offset]!;
  const v = -c1 / (2 * c2);
  if (!(v >= a - peak && v <= b - peak)) return E[peak + offset]!;
  const step = (E[E.length - 1]! - E[0]!) / (E.length - 1);
  return E[peak + offset]! + v * step;
}
