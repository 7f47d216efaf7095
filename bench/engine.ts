/**
 * Engine benchmark: analyses N absorption spectra of 4096 points against a reference,
 * single-threaded, and times a SciPy pipeline (savgol_filter, find_peaks, peak_widths, difference)
 * on the same arrays. Usage: npm run bench:engine [-- --spectra 2000]
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyzeSpectrum, type ParsedSpectrum } from '../lib/engine/index';

const args = process.argv.slice(2);
const N = Number(args[args.indexOf('--spectra') + 1]) || 2000;
const M = 4096;
const HC = 1239.841984;

function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (((t ^ (t >>> 14)) >>> 0) / 4294967296) - 0.5;
  };
}

const x = Float64Array.from({ length: M }, (_, i) => 350 + (450 * i) / (M - 1));
function make(k: number): ParsedSpectrum {
  const r = rng(k + 1);
  const bleach = k === 0 ? 1 : 1 - 0.3 * (k % 3 === 0 ? 1 : 0);
  const shift = k % 5 === 0 ? -0.01 : 0;
  const y = new Float64Array(M);
  for (let i = 0; i < M; i++) {
    const e = HC / x[i]!;
    y[i] =
      bleach * 0.5 * Math.exp(-0.5 * ((e - 2.2 - shift) / 0.045) ** 2) +
      0.35 * Math.exp(-0.5 * ((e - 2.42) / 0.07) ** 2) +
      0.5 * Math.exp(-0.5 * ((e - 2.9) / 0.15) ** 2) +
      0.004 * r();
  }
  return { fileName: `b${k}`, format: 'delimited', x, y, xUnit: 'nm', yUnit: 'absorbance', xOrderInFile: 'ascending', technique: 'absorption', columnName: 'A', columnIndex: 1, availableColumns: ['A'], metadata: {}, warnings: [] };
}

const spectra: ParsedSpectrum[] = [];
for (let k = 0; k <= N; k++) spectra.push(make(k));
const reference = spectra[0]!;
let peakRss = process.memoryUsage().rss;
// warm-up
for (let k = 1; k <= 20; k++) analyzeSpectrum(spectra[k]!, { reference });
let flags = 0;
let window = 0;
const t0 = performance.now();
for (let k = 1; k <= N; k++) {
  const rep = analyzeSpectrum(spectra[k]!, { reference });
  flags += rep.flags.length;
  window = rep.parameters.smoothing.windowSize;
  if ((k & 127) === 0) peakRss = Math.max(peakRss, process.memoryUsage().rss);
}
const seconds = (performance.now() - t0) / 1000;
peakRss = Math.max(peakRss, process.memoryUsage().rss);
const ours = N / seconds;

// SciPy on the same arrays (as uniform-grid data; the engine also resamples to an energy grid)
const dir = mkdtempSync(path.join(tmpdir(), 'bandkeep-bench-'));
const bin = path.join(dir, 'data.f64');
const all = new Float64Array((N + 1) * M);
spectra.forEach((s, k) => all.set(s.y, k * M));
writeFileSync(bin, new Uint8Array(all.buffer));
const here = path.dirname(fileURLToPath(import.meta.url));
let scipyRate = NaN;
try {
  const out = execFileSync('python3', [path.join(here, 'engine-reference.py'), bin, String(N), String(M), String(window)]);
  scipyRate = (JSON.parse(out.toString()) as { spectraPerSecond: number }).spectraPerSecond;
} finally {
  rmSync(dir, { recursive: true, force: true });
}
console.log(`spectra: ${N} x ${M} points (absorption vs reference), flags raised: ${flags}`);
console.log(`Bandkeep engine: ${ours.toFixed(1)} spectra/s (${seconds.toFixed(2)} s)`);
console.log(`scipy pipeline:  ${scipyRate.toFixed(1)} spectra/s`);
console.log(`ratio Bandkeep/scipy: ${(ours / scipyRate).toFixed(2)}`);
console.log(`peak RSS (Node): ${(peakRss / 1048576).toFixed(1)} MB`);
