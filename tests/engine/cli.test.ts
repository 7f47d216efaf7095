import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { ENGINE_VERSION } from '../../lib/engine/index';
import { absorptionCsv } from '../../lib/demo/synthetic';
import { realDir, repoRoot } from './scipy';

// The command-line contract of docs/analysis-json.md: one JSON object on stdout; bad input exits
// 2 with exactly one line on stderr that names the file, and no stack trace.
function run(args: string[]) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(repoRoot, 'scripts', 'analyze.ts'), ...args], {
    cwd: repoRoot,
    encoding: 'utf8',
    timeout: 60_000,
  });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

const TOP_FIELDS = [
  'technique',
  'engineVersion',
  'sample',
  'reference',
  'parameters',
  'noise',
  'peaks',
  'firstExciton',
  'referenceFirstExciton',
  'referenceMatch',
  'atmosphericBands',
  'flags',
  'derived',
  'warnings',
];
const FLAG_FIELDS = [
  'kind',
  'energyEv',
  'wavelengthNm',
  'fraction',
  'shiftMeV',
  'fwhmChangeMeV',
  'magnitude',
  'unit',
  'uncertainty',
  'significance',
  'message',
];

describe('scripts/analyze.ts', { timeout: 120_000 }, () => {
  let dir = '';
  beforeAll(() => {
    dir = mkdtempSync(path.join(tmpdir(), 'bandkeep-cli-'));
    // synthetic pair: 30 % bleach of the first exciton at 2.1 eV (lib/demo/synthetic.ts)
    writeFileSync(path.join(dir, 'parent.csv'), absorptionCsv({ firstExcitonEv: 2.1, seed: 1 }, 'parent'));
    writeFileSync(path.join(dir, 'charged.csv'), absorptionCsv({ firstExcitonEv: 2.1, seed: 2, bleach: 0.3 }, 'charged'));
    writeFileSync(path.join(dir, 'bad.csv'), 'Wavelength (nm),Absorbance\nfoo,bar\n1,2\n');
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('real file (CdSe growth series): one JSON object with the documented fields, exit 0, nothing on stderr', () => {
    const r = run([path.join(realDir, 'cdse-absorbance-growth-series.csv'), '--material', 'CdSe']);
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    const out = JSON.parse(r.stdout) as Record<string, unknown>;
    expect(Object.keys(out).sort()).toEqual([...TOP_FIELDS].sort());
    expect(out['engineVersion']).toBe(ENGINE_VERSION);
    expect(out['reference']).toBeNull();
    expect((out['sample'] as { points: number }).points).toBe(251); // PROVENANCE.md: 251 rows
    expect(out['flags']).toEqual([]);
    const fx = out['firstExciton'] as { wavelengthNm: number } | null;
    expect(fx).not.toBeNull();
    // the 30 s aliquot's first exciton lies inside the file's 350–600 nm range
    expect(fx!.wavelengthNm).toBeGreaterThan(350);
    expect(fx!.wavelengthNm).toBeLessThan(600);
  });

  it('synthetic pair written to a temp dir: a bleach flag with the documented fields', () => {
    const r = run([path.join(dir, 'charged.csv'), '--reference', path.join(dir, 'parent.csv')]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as { flags: Array<Record<string, unknown>>; reference: { fileName: string } };
    expect(out.reference.fileName).toBe('parent.csv');
    const bleach = out.flags.find((f) => f['kind'] === 'bleach');
    expect(bleach).toBeDefined();
    for (const k of FLAG_FIELDS) expect(bleach).toHaveProperty(k);
    // truth from the generator's formula (lib/demo/synthetic.ts): at E₁ = 2.1 eV the parent has
    // 0.3 (exciton) + 0.18·e^(−5.56) (second band) + 0.55/(1 + e^(0.5/0.12)) (continuum) ≈ 0.3092, and
    // the bleach removes 0.09 of it: fraction ≈ 0.291; ±0.02 for noise and the offset baseline
    expect(Math.abs((bleach!['fraction'] as number) - 0.291)).toBeLessThan(0.02);
  });

  for (const [name, args, mention] of [
    ['unparsable file', ['bad.csv'], 'bad.csv'],
    ['missing file', ['missing.csv'], 'missing.csv'],
  ] as const) {
    it(`bad input (${name}): exit 2, exactly one stderr line naming the file, no stack trace, empty stdout`, () => {
      const r = run(args.map((a) => path.join(dir, a)));
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      const lines = r.stderr.split('\n').filter((l) => l.length > 0);
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(/^analyze: /);
      expect(lines[0]).toContain(mention);
      expect(r.stderr).not.toMatch(/\n\s+at /);
    });
  }

  it('--normalize: the choice and its reason are in the output; a bad value exits 2 naming the option', () => {
    const r = run([path.join(dir, 'charged.csv'), '--reference', path.join(dir, 'parent.csv'), '--normalize', 'none']);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as { parameters: { normalization: { mode: string; details: { applied: string; reason: string } } } };
    expect(out.parameters.normalization.mode).toBe('none');
    expect(out.parameters.normalization.details.reason).toMatch(/chosen by the caller/);
    const bad = run([path.join(dir, 'charged.csv'), '--normalize', 'sideways']);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('--normalize must be auto, none, wavelength:NM or concentration:SAMPLE/REF');
  });

  it('unknown option: exit 2 with the usage line', () => {
    const r = run(['x.csv', '--frobnicate', '1']);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('unknown option --frobnicate');
  });

  describe('reading options: --x-unit, --y-kind, --pair, --block, --sheet', () => {
    // Cells of the real CdSe export (PROVENANCE.md), re-laid out here by test code.
    const src = readFileSync(path.join(realDir, 'cdse-absorbance-growth-series.csv'), 'utf8')
      .split(/\r?\n/)
      .filter((l) => l.trim());
    const head = src[0]!.split(',');
    const rows = src.slice(1).map((l) => l.split(','));
    const k240 = head.indexOf('240 s');
    const k30 = head.indexOf('30 s');
    const firstExciton = (args: string[]) => {
      const r = run(args);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
      return JSON.parse(r.stdout) as {
        firstExciton: { wavelengthNm: number } | null;
        peaks: unknown[];
        sample: { xUnit: string; yUnit: string; points: number };
      };
    };
    it('--pair 2 on a side-by-side file gives the same analysis as --column "240 s" on the original', () => {
      const pairs = path.join(dir, 'pairs.csv');
      writeFileSync(
        pairs,
        ['Серия А,,Серия Б,', 'λ (nm),A,λ (nm),A', ...rows.map((r) => `${r[0]},${r[k30]},${r[0]},${r[k240]}`)].join('\n'),
      );
      const a = firstExciton([pairs, '--pair', '2', '--technique', 'absorption']);
      const b = firstExciton([path.join(realDir, 'cdse-absorbance-growth-series.csv'), '--column', '240 s']);
      expect(a.peaks).toEqual(b.peaks);
      expect(a.firstExciton).toEqual(b.firstExciton);
    });
    it('a headerless file in an ambiguous range is refused until --x-unit says the unit', () => {
      const bare = path.join(dir, 'bare.txt');
      // near-IR scan written high to low, 2000 → 1200: nm or cm-1 (docs/ingest.md, rule 5)
      writeFileSync(
        bare,
        Array.from(
          { length: 200 },
          (_, i) => `${2000 - 4 * i}\t${(0.2 + 0.1 * Math.exp(-(((1500 - (2000 - 4 * i)) / 60) ** 2))).toFixed(5)}`,
        ).join('\n'),
      );
      const refused = run([bare, '--technique', 'absorption']);
      expect(refused.code).toBe(2);
      expect(refused.stderr).toMatch(/bare\.txt.*X unit unknown.*choose the X unit/);
      const ok = firstExciton([bare, '--x-unit', 'nm', '--y-kind', 'absorbance', '--technique', 'absorption']);
      expect(ok.sample.xUnit).toBe('nm');
      expect(ok.sample.yUnit).toBe('absorbance');
    });
    it("--y-kind transmittance-percent is the engine's percent-transmittance", () => {
      const r = firstExciton([
        path.join(realDir, 'cdse-absorbance-growth-series.csv'),
        '--y-kind',
        'transmittance-percent',
        '--technique',
        'ir',
      ]);
      expect(r.sample.yUnit).toBe('percent-transmittance');
    });
    it('--block 2 reads the second block', () => {
      const blocks = path.join(dir, 'blocks.csv');
      const block = (k: number) => [`Wavelength (nm),${head[k]}`, ...rows.map((r) => `${r[0]},${r[k]}`)];
      writeFileSync(blocks, [...block(k30), '', ...block(k240)].join('\n'));
      const a = firstExciton([blocks, '--block', '2', '--technique', 'absorption']);
      const b = firstExciton([path.join(realDir, 'cdse-absorbance-growth-series.csv'), '--column', '240 s']);
      expect(a.peaks).toEqual(b.peaks);
    });
    it('--sheet picks a spreadsheet sheet; a sheet without numbers says what to do', async () => {
      const ExcelJS = (await import('exceljs')).default;
      const wb = new ExcelJS.Workbook();
      wb.addWorksheet('Notes').addRow(['notes only']);
      const ws = wb.addWorksheet('Results');
      ws.addRow(['Wavelength (nm)', '240 s']);
      for (const r of rows) ws.addRow([Number(r[0]), Number(r[k240])]);
      const book = path.join(dir, 'book.xlsx');
      writeFileSync(book, new Uint8Array(await wb.xlsx.writeBuffer()));
      const a = firstExciton([book, '--sheet', 'Results', '--y-kind', 'absorbance']);
      const b = firstExciton([path.join(realDir, 'cdse-absorbance-growth-series.csv'), '--column', '240 s']);
      expect(a.peaks).toEqual(b.peaks);
      const refused = run([book, '--sheet', 'Notes']);
      expect(refused.code).toBe(2);
      expect(refused.stderr.trim()).toBe(
        "analyze: book.xlsx: no numeric table found on sheet 'Notes'; export the sheet as CSV or choose another sheet",
      );
    });
    it('bad option values exit 2 naming the option', () => {
      for (const [args, re] of [
        [['x.csv', '--x-unit', 'angstrom'], /--x-unit must be nm, um, cm-1, eV/],
        [['x.csv', '--y-kind', 'od'], /--y-kind must be absorbance, transmittance-percent, intensity/],
        [['x.csv', '--pair', '0'], /--pair must be a whole number from 1/],
      ] as const) {
        const r = run([...args]);
        expect(r.code).toBe(2);
        expect(r.stderr).toMatch(re);
      }
    });
  });
});
