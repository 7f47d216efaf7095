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
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296 - 0.5;
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
  return {
    fileName: `b${k}`,
    format: 'delimited',
    x,
    y,
    xUnit: 'nm',
    yUnit: 'absorbance',
    xOrderInFile: 'ascending',
    technique: 'absorption',
    columnName: 'A',
    columnIndex: 1,
    availableColumns: ['A'],
    metadata: {},
    warnings: [],
  };
}

const spectra: ParsedSpectrum[] = [];
for (let k = 0; k <= N; k++) spectra.push(make(k));
const reference = spectra[0]!;
let peakRss = process.memoryUsage().rss;
// warm-up (not timed)
let window = 0;
for (let k = 1; k <= 20; k++) window = analyzeSpectrum(spectra[k]!, { reference }).parameters.smoothing.windowSize;

// SciPy gets the same arrays (as uniform-grid data; the engine also resamples to an energy grid)
const dir = mkdtempSync(path.join(tmpdir(), 'bandkeep-bench-'));
const bin = path.join(dir, 'data.f64');
{
  // one contiguous copy, written and dropped before timing (keeps peak RSS to the spectra themselves)
  const all = new Float64Array((N + 1) * M);
  spectra.forEach((s, k) => all.set(s.y, k * M));
  writeFileSync(bin, new Uint8Array(all.buffer));
}
const here = path.dirname(fileURLToPath(import.meta.url));

// Both sides run the same spectra in alternating rounds, so that a change of machine load during
// the run (other processes on a shared machine) falls on both sides alike. Wall-clock and CPU time
// (this process; the Python process) are both reported.
const ROUNDS = 4;
let flags = 0;
const ours = { wall: 0, cpu: 0 };
const theirs = { wall: 0, cpu: 0 };
try {
  for (let round = 0; round < ROUNDS; round++) {
    const start = 1 + Math.floor((N * round) / ROUNDS);
    const end = 1 + Math.floor((N * (round + 1)) / ROUNDS);
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    for (let k = start; k < end; k++) {
      const rep = analyzeSpectrum(spectra[k]!, { reference });
      flags += rep.flags.length;
      if ((k & 127) === 0) peakRss = Math.max(peakRss, process.memoryUsage().rss);
    }
    ours.wall += (performance.now() - t0) / 1000;
    const c = process.cpuUsage(c0);
    ours.cpu += (c.user + c.system) / 1e6;
    const out = execFileSync('python3', [
      path.join(here, 'engine-reference.py'),
      bin,
      String(N),
      String(M),
      String(window),
      String(start),
      String(end),
    ]);
    const r = JSON.parse(out.toString()) as { seconds: number; cpuSeconds: number };
    theirs.wall += r.seconds;
    theirs.cpu += r.cpuSeconds;
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
peakRss = Math.max(peakRss, process.memoryUsage().rss);
const rate = (t: number) => N / t;
console.log(`spectra: ${N} x ${M} points (absorption vs reference), flags raised: ${flags}, ${ROUNDS} alternating rounds`);
console.log(
  `Bandkeep engine: ${rate(ours.wall).toFixed(1)} spectra/s (${ours.wall.toFixed(2)} s wall; ${rate(ours.cpu).toFixed(1)} spectra/s per CPU second)`,
);
console.log(
  `scipy pipeline:  ${rate(theirs.wall).toFixed(1)} spectra/s (${theirs.wall.toFixed(2)} s wall; ${rate(theirs.cpu).toFixed(1)} spectra/s per CPU second)`,
);
console.log(
  `ratio Bandkeep/scipy: ${(rate(ours.wall) / rate(theirs.wall)).toFixed(2)} (wall), ${(rate(ours.cpu) / rate(theirs.cpu)).toFixed(2)} (CPU time)`,
);
console.log(`peak RSS (Node): ${(peakRss / 1048576).toFixed(1)} MB`);
