import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { scratchDir, stria, TINY_SETS } from './support/stria';

const dir = scratchDir('run-threads');

// The thread count is recorded beside the results, never in them: the state of a run is the same bits
// on any number of threads (lib/model/stepTeam.ts fixes every reduction's order).
describe('stria run --threads', () => {
  it('steps on the threads asked, records them in the run file and the NetCDF files, same bits as one', () => {
    const one = join(dir, 'one.json');
    const two = join(dir, 'two.json');
    const snaps = join(dir, 'two.nc');
    const a = stria(['run', ...TINY_SETS, '--steps', '40', '--threads', '1', '--save', one]);
    expect(a.status, a.stderr).toBe(0);
    const b = stria([
      'run',
      ...TINY_SETS,
      '--steps',
      '40',
      '--threads',
      '2',
      '--save',
      two,
      '--snapshots',
      snaps,
      '--every',
      '20',
    ]);
    expect(b.status, b.stderr).toBe(0);
    expect(b.stderr).not.toMatch(/could not start/);
    const fileOne = JSON.parse(readFileSync(one, 'utf8'));
    const fileTwo = JSON.parse(readFileSync(two, 'utf8'));
    expect(fileOne.threads).toBe(1);
    expect(fileTwo.threads).toBe(2);
    expect(fileTwo.state).toEqual(fileOne.state);
    expect(readNetcdf(readFileSync(snaps)).attributes.stria_threads).toBe(2);
  });

  it('takes one thread on a small grid when --threads is not given', () => {
    const saved = join(dir, 'default.json');
    const r = stria(['run', ...TINY_SETS, '--steps', '2', '--save', saved]);
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(readFileSync(saved, 'utf8')).threads).toBe(1);
  });

  it('refuses a thread count it cannot take, naming the option, with exit code 2', () => {
    for (const n of ['0', '65', 'two']) {
      const r = stria(['run', ...TINY_SETS, '--steps', '2', '--threads', n]);
      expect(r.status, `--threads ${n}`).toBe(2);
      expect(r.stderr).toMatch(/--threads/);
    }
  });
});
