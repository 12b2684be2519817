import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { decodeRunFile } from '../../lib/io/runFile';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { stateChecksum } from '../../lib/io/digest';
import { striaInterrupted } from './support/interruptible';
import { scratchDir, stria, striaHere, TINY_SETS } from './support/stria';

const dir = scratchDir('checkpoint');
const at = (name: string) => join(dir, name);

/** Every variable of a NetCDF file, record by record (headers may differ: they hold the command). */
function records(path: string): Record<string, number[]> {
  const nc = readNetcdf(readFileSync(path));
  return Object.fromEntries(nc.variables.map((v) => [v.name, Array.from(nc.readVariable(v.name))]));
}

const checksumOf = (runFile: string) => stateChecksum(decodeRunFile(readFileSync(runFile, 'utf8')).qHat);

describe('stria run checkpoints', () => {
  // One command, run whole and run interrupted then resumed: same state, summary and records.
  for (const [name, length, looks] of [
    ['steps', ['--steps', '400'], 7],
    ['until-steady', ['--set', 'mu=0.5', '--set', 'eps=0.5', '--until-steady', '--steady-tol', '0.1'], 3],
  ] as const) {
    it(`resumes an interrupted run bit for bit (${name}): state checksum, summary and NetCDF records`, async () => {
      const cmd = (tag: string) => [
        'run',
        ...TINY_SETS,
        ...length,
        '--sample-every',
        '0.25',
        '--zonal',
        at(`${name}-${tag}-z.nc`),
        '--snapshots',
        at(`${name}-${tag}-s.nc`),
        '--every',
        '40',
        '--json',
      ];
      const whole = await striaHere([...cmd('whole'), '--save', at(`${name}-whole.json`)]);
      expect(whole.status, whole.stderr).toBe(0);
      const ck = at(`${name}-ck.json`);
      const part = [...cmd('part'), '--checkpoint', ck, '--checkpoint-every', '50'];
      const cut = await striaInterrupted(part, looks);
      expect(cut.status, cut.stderr).toBe(130);
      expect(cut.stderr).toMatch(/resume with the same command plus --resume/);
      const stoppedAt = JSON.parse(cut.stdout).steps;
      expect(stoppedAt).toBeGreaterThan(0);
      expect(stoppedAt).toBeLessThan(JSON.parse(whole.stdout).steps);
      const resumed = stria([...part, '--resume', ck, '--save', at(`${name}-resumed.json`)]);
      expect(resumed.status, resumed.stderr).toBe(0);
      expect(resumed.stderr).toMatch(new RegExp(`resumed from .* step ${stoppedAt}`));
      expect(resumed.stdout).toBe(whole.stdout);
      expect(checksumOf(at(`${name}-resumed.json`))).toBe(checksumOf(at(`${name}-whole.json`)));
      expect(records(at(`${name}-part-z.nc`))).toEqual(records(at(`${name}-whole-z.nc`)));
      expect(records(at(`${name}-part-s.nc`))).toEqual(records(at(`${name}-whole-s.nc`)));
    });
  }

  it('refuses to resume a different run, or a damaged checkpoint, naming what differs', async () => {
    const ck = at('refuse-ck.json');
    expect(
      (await striaHere(['run', ...TINY_SETS, '--steps', '60', '--checkpoint', ck, '--checkpoint-every', '20'])).status,
    ).toBe(0);
    const other = await striaHere(['run', ...TINY_SETS, '--set', 'beta=12', '--steps', '60', '--resume', ck]);
    expect(other.status).toBe(2);
    expect(other.stderr).toMatch(/the checkpoint is of another run \(beta = 12 here, 10 in the checkpoint\)/);
    const longer = await striaHere(['run', ...TINY_SETS, '--steps', '90', '--resume', ck]);
    expect(longer.status).toBe(2);
    expect(longer.stderr).toMatch(/the run plan differs/);
    const text = readFileSync(ck, 'utf8');
    const i = text.indexOf('"qHat"') + 60;
    writeFileSync(at('damaged.json'), text.slice(0, i) + (text[i] === 'A' ? 'B' : 'A') + text.slice(i + 1));
    const damaged = await striaHere(['run', ...TINY_SETS, '--steps', '60', '--resume', at('damaged.json')]);
    expect(damaged.status).toBe(2);
    expect(damaged.stderr).toMatch(/progress\.digest: does not match the file/);
    const missing = await striaHere(['run', ...TINY_SETS, '--steps', '60', '--resume', at('nope.json')]);
    expect(missing.status).toBe(2);
    expect(missing.stderr).toMatch(/--resume .*nope\.json: cannot read it: ENOENT/);
    // A finished run resumed takes no further step; a checkpoint is also a run file to continue.
    const again = await striaHere(['run', ...TINY_SETS, '--steps', '60', '--resume', ck, '--json']);
    expect(again.status, again.stderr).toBe(0);
    expect(JSON.parse(again.stdout).steps).toBe(60);
    const on = await striaHere(['run', ck, '--steps', '5', '--json']);
    expect(on.status, on.stderr).toBe(0);
    expect(JSON.parse(on.stdout).steps).toBe(65);
  });
});
