// Synthetic instrument exports for tests and the ingest bench: an absorption spectrum of
// invented nanocrystals (a first-exciton band on a scattering background), as CSV text.
import { seededUniform } from "@/lib/demo/synthetic";

export type SyntheticOptions = {
  /** Points, evenly spaced in wavelength. Default 2000. */
  points?: number;
  /** First-exciton position, nm. Default 560. */
  excitonNm?: number;
  /** First-exciton height (absorbance). Default 0.4. */
  excitonHeight?: number;
  /** Noise amplitude (absorbance); deterministic from `seed`. Default 0.002. */
  noise?: number;
  /** Seed for the noise and a tiny offset that makes every file's bytes different. Default 1. */
  seed?: number;
  startNm?: number;
  endNm?: number;
};

export function syntheticAbsorptionCsv(options: SyntheticOptions = {}): string {
  const n = options.points ?? 2000;
  const start = options.startNm ?? 400;
  const end = options.endNm ?? 750;
  const x0 = options.excitonNm ?? 560;
  const h = options.excitonHeight ?? 0.4;
  const noise = options.noise ?? 0.002;
  const rnd = seededUniform(options.seed ?? 1);
  const lines = ["wavelength (nm),absorbance"];
  for (let i = 0; i < n; i++) {
    const nm = start + ((end - start) * i) / (n - 1);
    const ev = 1239.841984 / nm;
    const ev0 = 1239.841984 / x0;
    const band = h * Math.exp(-0.5 * ((ev - ev0) / 0.045) ** 2);
    const second = 0.6 * h * Math.exp(-0.5 * ((ev - ev0 - 0.2) / 0.06) ** 2);
    const background = 0.05 * (450 / nm) ** 4 + (ev > ev0 + 0.35 ? 0.3 * (ev - ev0 - 0.35) : 0);
    const y = band + second + background + noise * (rnd() - 0.5) * 2;
    lines.push(`${nm.toFixed(3)},${y.toFixed(6)}`);
  }
  return `${lines.join("\n")}\n`;
}

export const enc = (s: string) => new TextEncoder().encode(s);
