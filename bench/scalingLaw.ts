import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { RHINES_EXAMPLE } from '../lib/sweep/rhinesExample';
import type { SweepFits } from '../lib/sweep/sweepFits';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

export interface ScalingLawResult {
  runs: number;
  jobs: number;
  wall_seconds: number;
  fits: SweepFits;
}

/**
 * The README's sweep of the Rhines scaling (lib/sweep/rhinesExample.ts) through `stria sweep`, as a
 * user runs it, on every core: its wall time and its fits. The exponent of jet spacing against the
 * Rhines length should have an interval containing 1 and excluding 0.
 */
export function scalingLaw(jobs = availableParallelism()): ScalingLawResult {
  const dir = mkdtempSync(join(tmpdir(), 'stria-scaling-law-'));
  try {
    const spec = join(dir, 'rhines.json');
    writeFileSync(spec, JSON.stringify(RHINES_EXAMPLE));
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [join(root, 'cli', 'stria.js'), 'sweep', spec, '--jobs', String(jobs)], {
      cwd: dir,
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    const wall = (performance.now() - t0) / 1000;
    if (r.status !== 0) throw new Error(`stria sweep failed with status ${r.status}`);
    const fits = JSON.parse(readFileSync(join(dir, 'rhines-results', 'fits.json'), 'utf8')) as SweepFits;
    const runs = readFileSync(join(dir, 'rhines-results', 'runs.jsonl'), 'utf8')
      .trim()
      .split('\n').length;
    return { runs, jobs, wall_seconds: wall, fits };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
