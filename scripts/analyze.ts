/**
 * Command-line analysis: prints one JSON object (docs/analysis-json.md) on stdout.
 * npm run -s analyze -- SAMPLE [--reference REF] [--technique absorption|pl|ir]
 *   [--material CdSe|CdTe|CdS|PbS|PbSe] [--path-length-cm L] [--excitation-nm N] [--column NAME|INDEX]
 *   [--normalize auto|none|wavelength:NM|concentration:SAMPLE/REF] [--dark-level auto|none]
 *   [--sample-abs-ex A] [--sample-abs-em A] [--sample-dots-abs-ex A]
 *   [--reference-abs-ex A] [--reference-abs-em A] [--reference-dots-abs-ex A]
 *   [--x-unit nm|um|cm-1|eV] [--y-kind absorbance|transmittance-percent|intensity] [--block N] [--pair N] [--sheet NAME|N]
 * Bad input: exit code 2 and one line on stderr.
 */
import { readFileSync, statSync } from 'node:fs';
import { basename } from 'node:path';
import {
  analyzeSpectrum,
  parseSpectrumBytes,
  SpectrumFileError,
  isMaterialName,
  DEFAULT_MAX_BYTES,
  X_UNIT_NAMES,
  Y_KIND_NAMES,
  readChoiceOptions,
} from '../lib/engine/index';
import type { AnalysisOptions, Normalization, ParseOptions, ReadChoice, Technique, XUnit, YKind } from '../lib/engine/index';
import { TECHNIQUES, isTechnique } from '../lib/registry/techniques';

class UsageError extends Error {}

/** Options that say how to read the files (they apply to the sample and the reference alike). */
const READ_OPTIONS = ['x-unit', 'y-kind', 'block', 'pair', 'sheet'] as const;

function readChoice(opts: Record<string, string>): ReadChoice {
  const choice: ReadChoice = {};
  const xUnit = opts['x-unit'];
  if (xUnit !== undefined) {
    if (!(X_UNIT_NAMES as string[]).includes(xUnit)) throw new UsageError(`--x-unit must be ${X_UNIT_NAMES.join(', ')}, got "${xUnit}"`);
    choice.xUnit = xUnit as XUnit;
  }
  const yKind = opts['y-kind'];
  if (yKind !== undefined) {
    if (!(Y_KIND_NAMES as string[]).includes(yKind)) throw new UsageError(`--y-kind must be ${Y_KIND_NAMES.join(', ')}, got "${yKind}"`);
    choice.yKind = yKind as YKind;
  }
  for (const key of ['block', 'pair'] as const) {
    const v = opts[key];
    if (v === undefined) continue;
    if (!/^[1-9]\d*$/.test(v)) throw new UsageError(`--${key} must be a whole number from 1, got "${v}"`);
    choice[key] = Number(v);
  }
  if (opts['sheet'] !== undefined) choice.sheet = /^\d+$/.test(opts['sheet']) ? Number(opts['sheet']) : opts['sheet'];
  return choice;
}

const USAGE = `usage: analyze SAMPLE [--reference REF] [--technique ${TECHNIQUES.join('|')}] [--material CdSe|CdTe|CdS|PbS|PbSe] [--path-length-cm L] [--excitation-nm N] [--column NAME|INDEX] [--reference-column NAME|INDEX] [--sizing yu2003|jasieniak2009] [--normalize auto|none|wavelength:NM|concentration:SAMPLE/REF] [--dark-level auto|none] [--sample-abs-ex A] [--sample-abs-em A] [--sample-dots-abs-ex A] [--reference-abs-ex A] [--reference-abs-em A] [--reference-dots-abs-ex A] [--x-unit nm|um|cm-1|eV] [--y-kind absorbance|transmittance-percent|intensity] [--block N] [--pair N] [--sheet NAME|N]`;

/** PL absorbance flags and the AnalysisOptions member each one sets. */
const ABSORBANCE_FLAGS = {
  'sample-abs-ex': 'sampleAbsorbanceAtExcitation',
  'sample-abs-em': 'sampleAbsorbanceAtEmission',
  'sample-dots-abs-ex': 'sampleDotsAbsorbanceAtExcitation',
  'reference-abs-ex': 'referenceAbsorbanceAtExcitation',
  'reference-abs-em': 'referenceAbsorbanceAtEmission',
  'reference-dots-abs-ex': 'referenceDotsAbsorbanceAtExcitation',
} as const satisfies Record<string, keyof AnalysisOptions>;

/** Reads --normalize: auto, none, wavelength:NM or concentration:SAMPLE/REF. */
function parseNormalize(v: string): Normalization {
  if (v === 'auto' || v === 'none') return { mode: v };
  const wl = /^wavelength:(.+)$/.exec(v);
  if (wl) {
    const nm = Number(wl[1]);
    if (!Number.isFinite(nm) || nm <= 0)
      throw new UsageError(`--normalize wavelength:NM needs a positive wavelength in nm, got "${wl[1]}"`);
    return { mode: 'wavelength', wavelengthNm: nm };
  }
  const c = /^concentration:([^/]+)\/(.+)$/.exec(v);
  if (c) {
    const [a, b] = [Number(c[1]), Number(c[2])];
    if (!(Number.isFinite(a) && a > 0 && Number.isFinite(b) && b > 0))
      throw new UsageError(`--normalize concentration:SAMPLE/REF needs two positive concentrations, got "${c[1]}/${c[2]}"`);
    return { mode: 'concentration', sampleConcentration: a, referenceConcentration: b };
  }
  throw new UsageError(`--normalize must be auto, none, wavelength:NM or concentration:SAMPLE/REF, got "${v}"`);
}

function parseArgs(argv: string[]) {
  const positional: string[] = [];
  const opts: Record<string, string> = {};
  const known = new Set([
    'reference',
    'technique',
    'material',
    'path-length-cm',
    'excitation-nm',
    'column',
    'reference-column',
    'sizing',
    'normalize',
    'dark-level',
    ...Object.keys(ABSORBANCE_FLAGS),
    ...READ_OPTIONS,
  ]);
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a.startsWith('--')) {
      const eq = a.indexOf('=');
      const key = eq > 0 ? a.slice(2, eq) : a.slice(2);
      if (key === 'help') throw new UsageError(USAGE);
      if (!known.has(key)) throw new UsageError(`unknown option --${key}; ${USAGE}`);
      const value = eq > 0 ? a.slice(eq + 1) : argv[++i];
      if (value === undefined) throw new UsageError(`option --${key} needs a value`);
      opts[key] = value;
    } else positional.push(a);
  }
  if (positional.length !== 1) throw new UsageError(USAGE);
  return { sample: positional[0]!, opts };
}

function positiveNumber(name: string, v: string | undefined): number | undefined {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isFinite(n) || n <= 0) throw new UsageError(`--${name} must be a positive number, got "${v}"`);
  return n;
}

function readBytes(path: string): Uint8Array {
  let size: number;
  try {
    size = statSync(path).size;
  } catch {
    throw new UsageError(`${path}: file not found or unreadable`);
  }
  if (size > DEFAULT_MAX_BYTES)
    throw new SpectrumFileError(basename(path), `file is ${size} bytes, over the ${DEFAULT_MAX_BYTES}-byte limit`);
  return new Uint8Array(readFileSync(path));
}

async function main(): Promise<void> {
  const { sample, opts } = parseArgs(process.argv.slice(2));
  const technique = opts['technique'] as Technique | undefined;
  if (technique && !isTechnique(technique)) {
    throw new UsageError(
      `--technique must be ${TECHNIQUES.slice(0, -1).join(', ')} or ${TECHNIQUES[TECHNIQUES.length - 1]}, got "${technique}"`,
    );
  }
  const material = opts['material'];
  if (material !== undefined && !isMaterialName(material))
    throw new UsageError(`--material must be CdSe, CdTe, CdS, PbS or PbSe, got "${material}"`);
  const sizing = opts['sizing'];
  if (sizing !== undefined && sizing !== 'yu2003' && sizing !== 'jasieniak2009')
    throw new UsageError('--sizing must be yu2003 or jasieniak2009');
  const choice = readChoice(opts);
  const colArg = (v: string | undefined) => (v === undefined ? undefined : /^\d+$/.test(v) ? Number(v) : v);
  const parseOpts = (col: string | undefined): ParseOptions => {
    const o: ParseOptions = readChoiceOptions(choice);
    const c = colArg(col);
    if (c !== undefined) o.column = c;
    if (technique) o.technique = technique;
    return o;
  };
  const s = await parseSpectrumBytes(basename(sample), readBytes(sample), parseOpts(opts['column']));
  const r = opts['reference']
    ? await parseSpectrumBytes(
        basename(opts['reference']),
        readBytes(opts['reference']),
        parseOpts(opts['reference-column'] ?? opts['column']),
      )
    : undefined;
  const a: AnalysisOptions & { reference?: typeof s } = {};
  if (technique) a.technique = technique;
  if (material) a.material = material;
  if (sizing) a.sizingModel = sizing;
  const pl = positiveNumber('path-length-cm', opts['path-length-cm']);
  if (pl !== undefined) a.pathLengthCm = pl;
  const ex = positiveNumber('excitation-nm', opts['excitation-nm']);
  if (ex !== undefined) a.excitationNm = ex;
  if (r) a.reference = r;
  if (opts['normalize'] !== undefined) a.normalization = parseNormalize(opts['normalize']);
  const dark = opts['dark-level'];
  if (dark !== undefined) {
    if (dark !== 'auto' && dark !== 'none') throw new UsageError(`--dark-level must be auto or none, got "${dark}"`);
    a.darkLevel = dark;
  }
  for (const [flag, member] of Object.entries(ABSORBANCE_FLAGS) as Array<
    [keyof typeof ABSORBANCE_FLAGS, (typeof ABSORBANCE_FLAGS)[keyof typeof ABSORBANCE_FLAGS]]
  >) {
    const v = opts[flag];
    if (v === undefined) continue;
    const x = Number(v);
    if (!Number.isFinite(x) || x < 0) throw new UsageError(`--${flag} must be a non-negative absorbance, got "${v}"`);
    a[member] = x;
  }
  const report = analyzeSpectrum(s, a);
  process.stdout.write(JSON.stringify(report, null, 2) + '\n');
}

main().catch((e: unknown) => {
  const msg =
    e instanceof SpectrumFileError || e instanceof UsageError || e instanceof RangeError
      ? e.message
      : `internal error: ${e instanceof Error ? e.message : String(e)}`;
  process.stderr.write(`analyze: ${msg.split('\n')[0]}\n`);
  process.exitCode = e instanceof SpectrumFileError || e instanceof UsageError || e instanceof RangeError ? 2 : 1;
});
