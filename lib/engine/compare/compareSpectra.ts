import { CM1_PER_EV, FWHM_PER_SIGMA, HC_EV_NM } from '../constants';
import { savitzkyGolayNoiseGain } from '../signal/savitzkyGolayWeights';
import type { ProcessedSpectrum } from '../processSpectrum';
import type { AnalysisThresholds, FlagReport, Technique } from '../types';
import { findLocalMaxima } from '../peaks/findLocalMaxima';
import { peakProminences } from '../peaks/peakProminences';
import { fitShiftBroadening } from './fitShiftBroadening';
import { innerFilterFactor } from '../derived/innerFilterFactor';

/** Mid-IR upper edge used to call a new band intraband: 4000 cm⁻¹ ≈ 0.496 eV (common practice). */
export const MID_IR_MAX_EV = 0.496;

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
  forceInnerFilterCorrection?: boolean | undefined;
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
export function compareSpectra(s: ProcessedSpectrum, r: ProcessedSpectrum, o: CompareOptions): { flags: FlagReport[]; warnings: string[] } {
  const t = o.thresholds;
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
  if (fx && fx.fwhmMeV) {
    const half = Math.max(1.5 * (fx.fwhmMeV / 1000), 6 * s.step);
    const from = Math.max(guard, Math.ceil((fx.energyEv - half - E[0]!) / s.step));
    const to = Math.min(n - guard, Math.floor((fx.energyEv + half - E[0]!) / s.step) + 1);
    // S − R noise: raw sample noise plus smoothed reference noise
    const sigmaFit = Math.sqrt(s.sigma ** 2 + r.sigmaSmoothed ** 2);
    fit = fitShiftBroadening(E, s.raw, r.smoothed, r.firstDerivative, r.secondDerivative, from, to, sigmaFit);
    if (fit) fitRange = [E[from]!, E[to - 1]!];
    else warnings.push('shift/broadening fit around the first exciton did not converge');
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
        message: `${o.technique === 'pl' ? 'emission' : 'first-exciton'} FWHM ${dF > 0 ? 'broadened' : 'narrowed'} by ${Math.abs(dF * 1000).toFixed(1)} meV (${((100 * dF) / f0).toFixed(1)} %)`,
      });
    }
  }

  // ---- bleach at the reference's first-exciton energy (absorption)
  if (fx && o.technique !== 'pl') {
    const Ar = interpAt(E, r.smoothed, fx.energyEv);
    const As = interpAt(E, s.smoothed, fx.energyEv);
    if (Ar > 0) {
      const fraction = (Ar - As) / Ar;
      // noise part, plus 0.5 % systematic on each of A_s and A_r (SYSTEMATIC_RELATIVE)
      const sigma = Math.sqrt((s.sigmaSmoothed / Ar) ** 2 + ((As * r.sigmaSmoothed) / (Ar * Ar)) ** 2 + 2 * (SYSTEMATIC_RELATIVE * (As / Ar)) ** 2);
      // part of the drop not explained by a shift, broadening or offset
      let unexplained = fraction;
      if (fit) {
        const k = Math.round((fx.energyEv - E[0]!) / s.step);
        const kk = k - fit.from;
        if (kk >= 0 && kk < fit.model.length) {
          const noAmp = fit.model[kk]! - fit.alpha * interpAt(E, r.smoothed, E[k]! - fit.shiftEv);
          unexplained = (noAmp - s.smoothed[k]!) / Ar;
        }
      }
      const sig = sigma > 0 ? unexplained / sigma : 0;
      if (fraction >= t.minBleachFraction && unexplained >= t.minBleachFraction && sig >= t.minSignificance) {
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
          message: `first-exciton absorbance down ${(100 * fraction).toFixed(1)} % at ${fx.wavelengthNm.toFixed(1)} nm`,
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
    }
    excess[i - lo] = value;
  }
  const uncertaintyAt = (i: number) => Math.sqrt(sigmaD ** 2 + SYSTEMATIC_RELATIVE ** 2 * (sDer[i]! ** 2 + rDer[i]! ** 2));
  const candidates: FlagReport[] = [];
  const maxima = findLocalMaxima(excess);
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
  const { prominences, leftBases: leftPadded, rightBases: rightPadded } = any
    ? peakProminences(padded, Int32Array.from(maxima, (m) => m + 1))
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
    const intraband = e <= MID_IR_MAX_EV;
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
      message: `new band at ${e.toFixed(3)} eV (${(HC_EV_NM / e).toFixed(0)} nm, ${(e * CM1_PER_EV).toFixed(0)} cm⁻¹)${intraband ? ', in the mid-IR: intraband' : ''}`,
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
    let corr = 1;
    if (o.sampleAbsorbanceAtExcitation !== undefined && o.referenceAbsorbanceAtExcitation !== undefined) {
      const fS = 1 - 10 ** -o.sampleAbsorbanceAtExcitation;
      const fR = 1 - 10 ** -o.referenceAbsorbanceAtExcitation;
      if (fS > 0 && fR > 0) corr *= fR / fS;
      const ifS = innerFilterFactor(o.sampleAbsorbanceAtExcitation, o.sampleAbsorbanceAtEmission ?? 0, o.forceInnerFilterCorrection);
      const ifR = innerFilterFactor(o.referenceAbsorbanceAtExcitation, o.referenceAbsorbanceAtEmission ?? 0, o.forceInnerFilterCorrection);
      corr *= ifS.factor / ifR.factor;
      warnings.push(...ifS.warnings.map((w) => `sample: ${w}`), ...ifR.warnings.map((w) => `reference: ${w}`));
    } else {
      warnings.push('absorbances at the excitation wavelength not given: PL quench not corrected for absorbed fraction or inner filter');
    }
    if (Fr > 0 && count > 0) {
      const ratio = (Fs / Fr) * corr;
      const fraction = 1 - ratio;
      const sFs = s.sigma * s.step * Math.sqrt(count);
      const sFr = r.sigma * s.step * Math.sqrt(count);
      const sigma = Math.abs(ratio) * Math.sqrt((sFs / Math.max(Math.abs(Fs), 1e-300)) ** 2 + (sFr / Fr) ** 2 + 2 * SYSTEMATIC_RELATIVE ** 2);
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
          message: `integrated PL down ${(100 * fraction).toFixed(1)} %`,
        });
      } else if (fraction <= -t.minQuenchFraction && -sig >= t.minSignificance) {
        warnings.push(`integrated PL up ${(-100 * fraction).toFixed(1)} % against the reference`);
      }
    } else {
      warnings.push('reference PL integral is not positive: quench not computed');
    }
  }
  void FWHM_PER_SIGMA;
  return { flags, warnings };
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
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
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
