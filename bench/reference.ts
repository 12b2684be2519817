import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

/** Where the C/FFTW yardstick lives on the development machines (beside the project checkout). */
const here = dirname(fileURLToPath(import.meta.url));
export const REFERENCE_SCRIPT = resolve(here, '../../shared/reference/run.sh');

export interface ReferenceTiming {
  n: number;
  ms_per_step: number;
  energy: number;
}

/** Why the reference cannot run here, or null when it can (script, gcc and FFTW headers present). */
export function referenceUnavailable(): string | null {
  if (!existsSync(REFERENCE_SCRIPT)) return `no reference at ${REFERENCE_SCRIPT}`;
  try {
    execFileSync('gcc', ['--version'], { stdio: 'ignore' });
  } catch {
    return 'gcc not found';
  }
  if (!existsSync('/usr/include/fftw3.h')) return 'libfftw3-dev not installed (apt-get install -y libfftw3-dev)';
  return null;
}

/** Run the C/FFTW reference step (same scheme, same transforms per step) and parse its JSON lines. */
export function runReference(): ReferenceTiming[] {
  const out = execFileSync('bash', [REFERENCE_SCRIPT], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] });
  return out
    .split('\n')
    .filter((l) => l.trim().startsWith('{'))
    .map((l) => JSON.parse(l) as ReferenceTiming);
}
