import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const here = path.dirname(fileURLToPath(import.meta.url));
/** Runs tests/engine/reference/scipy_ref.py with a JSON request on stdin. */
export function scipy<T>(request: Record<string, unknown>): T {
  const out = execFileSync('python3', [path.join(here, 'reference', 'scipy_ref.py')], {
    input: JSON.stringify(request),
    maxBuffer: 64 * 1024 * 1024,
  });
  return JSON.parse(out.toString()) as T;
}
export const repoRoot = path.resolve(here, '..', '..');
export const realDir = path.resolve(repoRoot, '..', 'shared', 'real-spectra');
