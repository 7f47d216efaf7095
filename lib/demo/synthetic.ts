// Synthetic spectra with known features for the demo scenario. Bands are Gaussians on
// an energy axis; exports are written the way instruments do (a header block, then
// wavelength or wavenumber against signal), so the demo goes through the real parser.

const HC_EV_NM = 1239.841984; // CODATA 2018

/** Deterministic uniform numbers in [0, 1) (mulberry32), so synthetic data is the same on every machine. */
export function seededUniform(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Deterministic standard-normal noise (Box–Muller on seededUniform). */
export function gaussianNoise(seed: number): () => number {
  const uniform = seededUniform(seed);
  return () => Math.sqrt(-2 * Math.log(uniform() || 1e-12)) * Math.cos(2 * Math.PI * uniform());
}

const gauss = (e: number, centre: number, sigma: number) => Math.exp(-0.5 * ((e - centre) / sigma) ** 2);

export type AbsorptionModel = {
  firstExcitonEv: number;
  /** Fraction of the first-exciton band removed (state filling). */
  bleach?: number;
  /** Extra band below the gap: centre (eV), height (absorbance), sigma (eV). */
  newBand?: { centreEv: number; height: number; sigmaEv: number };
  /** Rigid shift of the excitonic bands, meV (negative = red). */
  shiftMeV?: number;
  noise?: number;
  seed?: number;
  scale?: number;
};

/** Absorbance (before scale and noise) of the CdSe-like dispersion of absorptionCsv at energy e (eV). */
export function cdseLikeAbsorbance(e: number, model: AbsorptionModel): number {
  const e1 = model.firstExcitonEv + (model.shiftMeV ?? 0) / 1000;
  const exciton = 0.3 * (1 - (model.bleach ?? 0)) * gauss(e, e1, 0.045);
  const second = 0.18 * (1 - 0.6 * (model.bleach ?? 0)) * gauss(e, e1 + 0.2, 0.06);
  const continuum = 0.55 / (1 + Math.exp(-(e - (model.firstExcitonEv + 0.5)) / 0.12));
  const band = model.newBand ? model.newBand.height * gauss(e, model.newBand.centreEv, model.newBand.sigmaEv) : 0;
  return exciton + second + continuum + band;
}

/** Absorbance of a CdSe-like dispersion from 400 to 750 nm in 0.5 nm steps. */
export function absorptionCsv(model: AbsorptionModel, sampleLabel: string): string {
  const noise = gaussianNoise(model.seed ?? 1);
  const scale = model.scale ?? 1;
  const lines = [
    `Sample,${sampleLabel}`,
    "Instrument,demo double-beam spectrophotometer",
    "Path length (cm),1",
    "",
    "Wavelength (nm),Absorbance",
  ];
  for (let nm = 400; nm <= 750; nm += 0.5) {
    const value = scale * cdseLikeAbsorbance(HC_EV_NM / nm, model) + (model.noise ?? 0.0015) * noise();
    lines.push(`${nm.toFixed(1)},${value.toFixed(5)}`);
  }
  return lines.join("\r\n") + "\r\n";
}

/**
 * Absorbance (unscaled) of a PbS-like dispersion at energy e (eV): a first-exciton band on a
 * continuum that rises towards the blue, as lead-chalcogenide dots show (shape invented for the
 * demo, not a fit to any measurement).
 */
export function leadChalcogenideLikeAbsorbance(e: number, firstExcitonEv: number): number {
  return 0.05 * gauss(e, firstExcitonEv, 0.06) + 0.12 * Math.max(0, e - 0.9 * firstExcitonEv) ** 1.5;
}

/** Absorbance of a PbS-like dispersion from 400 to 1400 nm in 1 nm steps. */
export function leadChalcogenideCsv(
  model: { firstExcitonEv: number; scale?: number; noise?: number; seed?: number },
  sampleLabel: string,
): string {
  const noise = gaussianNoise(model.seed ?? 4);
  const lines = [
    `Sample,${sampleLabel}`,
    "Instrument,demo UV-vis-NIR spectrophotometer",
    "Path length (cm),1",
    "",
    "Wavelength (nm),Absorbance",
  ];
  for (let nm = 400; nm <= 1400; nm += 1) {
    const value =
      (model.scale ?? 1) * leadChalcogenideLikeAbsorbance(HC_EV_NM / nm, model.firstExcitonEv) + (model.noise ?? 0.0015) * noise();
    lines.push(`${nm},${value.toFixed(5)}`);
  }
  return lines.join("\r\n") + "\r\n";
}

export type SupernatantModel = {
  /** The CdSe-like dots left in the supernatant: their first exciton and their absorbance at one wavelength. */
  cdse: { firstExcitonEv: number; atNm: number; absorbance: number };
  /** The PbS-like dots left: their first exciton and their absorbance at one wavelength. */
  pbs: { firstExcitonEv: number; atNm: number; absorbance: number };
  noise?: number;
  seed?: number;
};

/**
 * Absorbance of a supernatant holding both kinds of dot, 400–750 nm in 0.5 nm steps: the two
 * shapes above, each scaled to the stated absorbance at its stated wavelength, added (Beer–Lambert
 * absorbances add), plus noise.
 */
export function supernatantCsv(model: SupernatantModel, sampleLabel: string): string {
  const noise = gaussianNoise(model.seed ?? 5);
  const cdse = { firstExcitonEv: model.cdse.firstExcitonEv };
  const scaleA = model.cdse.absorbance / cdseLikeAbsorbance(HC_EV_NM / model.cdse.atNm, cdse);
  const scaleX = model.pbs.absorbance / leadChalcogenideLikeAbsorbance(HC_EV_NM / model.pbs.atNm, model.pbs.firstExcitonEv);
  const lines = [
    `Sample,${sampleLabel}`,
    "Instrument,demo double-beam spectrophotometer",
    "Path length (cm),1",
    "",
    "Wavelength (nm),Absorbance",
  ];
  for (let nm = 400; nm <= 750; nm += 0.5) {
    const e = HC_EV_NM / nm;
    const value =
      scaleA * cdseLikeAbsorbance(e, cdse) +
      scaleX * leadChalcogenideLikeAbsorbance(e, model.pbs.firstExcitonEv) +
      (model.noise ?? 0.0015) * noise();
    lines.push(`${nm.toFixed(1)},${value.toFixed(5)}`);
  }
  return lines.join("\r\n") + "\r\n";
}

export type EmissionModel = { peakEv: number; sigmaEv?: number; intensity: number; excitationNm?: number; noise?: number; seed?: number };

/** PL emission counts from 450 to 750 nm, 1 nm steps. */
export function emissionCsv(model: EmissionModel, sampleLabel: string): string {
  const noise = gaussianNoise(model.seed ?? 2);
  const lines = [
    `Sample,${sampleLabel}`,
    `Excitation (nm),${model.excitationNm ?? 405}`,
    "Slit (nm),2",
    "",
    "Wavelength (nm),Intensity (counts)",
  ];
  for (let nm = 450; nm <= 750; nm += 1) {
    const e = HC_EV_NM / nm;
    const value = model.intensity * gauss(e, model.peakEv, model.sigmaEv ?? 0.05) + 40 + (model.noise ?? 15) * noise();
    lines.push(`${nm},${value.toFixed(1)}`);
  }
  return lines.join("\n") + "\n";
}

export type MidIrModel = { intrabandEv?: number; height?: number; noise?: number; seed?: number };

/** Mid-IR absorbance from 4000 to 1000 cm⁻¹ in 2 cm⁻¹ steps (ligand C–H bands included). */
export function midIrCsv(model: MidIrModel, sampleLabel: string): string {
  const noise = gaussianNoise(model.seed ?? 3);
  const lines = [`Sample,${sampleLabel}`, "Mode,transmission through film", "", "Wavenumber (cm-1),Absorbance"];
  for (let k = 4000; k >= 1000; k -= 2) {
    const e = k / 8065.54394; // 1 eV = 8065.54394 cm⁻¹ (CODATA 2018)
    const ligand = 0.25 * gauss(k, 2925, 18) + 0.18 * gauss(k, 2855, 15) + 0.06 * gauss(k, 1460, 20);
    const band = model.intrabandEv ? (model.height ?? 0.12) * gauss(e, model.intrabandEv, 0.04) : 0;
    lines.push(`${k},${(0.02 + ligand + band + (model.noise ?? 0.0015) * noise()).toFixed(5)}`);
  }
  return lines.join("\n") + "\n";
}
