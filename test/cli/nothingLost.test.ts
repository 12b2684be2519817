import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseSweepRecord } from '../../lib/sweep/sweepRecord';
import { scratchDir, stria, striaAsync, striaHere, TINY, TINY_SETS } from './support/stria';

/**
 * What the command line must never do: replace finished work unasked, write two outputs over one
 * file, let two sweeps write one journal, trust an edited journal line, or start a run that would
 * never end. Each refusal comes before anything is written and says what to do instead.
 */
const dir = scratchDir('nothing-lost');
const at = (name: string) => join(dir, name);
const bytesOf = (paths: string[]) => paths.map((p) => readFileSync(p).toString('base64'));

describe('stria run leaves earlier work alone unless told', () => {
  it('refuses a rerun over its own files, naming the file and the two choices, and changes nothing', async () => {
    const files = ['z.nc', 's.nc', 'ck.json', 'end.json'].map(at);
    const cmd = [
      'run',
      ...TINY_SETS,
      '--steps',
      '60',
      '--zonal',
      files[0],
      '--snapshots',
      files[1],
      '--every',
      '20',
      '--checkpoint',
      files[2],
      '--checkpoint-every',
      '20',
      '--save',
      files[3],
    ];
    expect((await striaHere(cmd)).status).toBe(0);
    const before = bytesOf(files);
    const again = await striaHere(cmd);
    expect(again.status).toBe(2);
    expect(again.stderr).toContain(`--snapshots ${files[1]} already exists`);
    expect(again.stderr).toMatch(
      /--resume .*ck\.json to continue the run that wrote it, or --overwrite to start afresh/,
    );
    expect(bytesOf(files)).toEqual(before);
    // Continuing is one choice; starting afresh over the files is the other.
    const resumed = await striaHere([...cmd, '--resume', files[2]]);
    expect(resumed.status, resumed.stderr).toBe(0);
    const afresh = await striaHere([...cmd, '--overwrite']);
    expect(afresh.status, afresh.stderr).toBe(0);
    const both = await striaHere([...cmd, '--overwrite', '--resume', files[2]]);
    expect(both.status).toBe(2);
    expect(both.stderr).toMatch(/--resume and --overwrite/);
  });

  it('refuses a file a resumed run would start afresh, unless told to overwrite it', async () => {
    const ck = at('r-ck.json');
    const base = ['run', ...TINY_SETS, '--steps', '40', '--checkpoint', ck, '--checkpoint-every', '20'];
    expect((await striaHere(base)).status).toBe(0);
    writeFileSync(at('r-z.nc'), 'an earlier result');
    const r = await striaHere([...base, '--zonal', at('r-z.nc'), '--resume', ck]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(`--zonal ${at('r-z.nc')} already exists`);
    expect(readFileSync(at('r-z.nc'), 'utf8')).toBe('an earlier result');
  });

  it('refuses two outputs on one file, and an output on an input, whatever the path says', async () => {
    const run = ['run', ...TINY_SETS, '--steps', '5'];
    const same = await striaHere([...run, '--zonal', at('same.nc'), '--snapshots', at('same.nc'), '--every', '5']);
    expect(same.status).toBe(2);
    expect(same.stderr).toMatch(
      /--snapshots and --zonal name the same file, .*same\.nc: give each output a file of its own/,
    );
    expect(existsSync(at('same.nc'))).toBe(false);
    const viaDots = await striaHere([
      ...run,
      '--zonal',
      at('x.nc'),
      '--checkpoint',
      join(dir, '.', 'sub', '..', 'x.nc'),
    ]);
    expect(viaDots.status).toBe(2);
    expect(viaDots.stderr).toMatch(/--zonal and --checkpoint name the same file/);
    writeFileSync(at('target.nc'), '');
    symlinkSync(at('target.nc'), at('link.nc'));
    const linked = await striaHere([
      ...run,
      '--zonal',
      at('target.nc'),
      '--snapshots',
      at('link.nc'),
      '--every',
      '5',
      '--overwrite',
    ]);
    expect(linked.status).toBe(2);
    expect(linked.stderr).toMatch(/name the same file/);
    writeFileSync(at('p.json'), JSON.stringify({ seed: 4 }));
    const onInput = await striaHere([
      'run',
      at('p.json'),
      ...TINY_SETS,
      '--steps',
      '5',
      '--save',
      at('p.json'),
      '--overwrite',
    ]);
    expect(onInput.status).toBe(2);
    expect(onInput.stderr).toMatch(/--save .*p\.json is also the file this command reads \(FILE\)/);
    expect(JSON.parse(readFileSync(at('p.json'), 'utf8'))).toEqual({ seed: 4 });
  });

  it('says in plain words when an output folder is missing or an output is a folder', async () => {
    const missing = await striaHere(['run', ...TINY_SETS, '--steps', '5', '--zonal', at('no/such/z.nc')]);
    expect(missing.status).toBe(2);
    expect(missing.stderr).toBe(
      `stria run: error: --zonal ${at('no/such/z.nc')}: the folder ${at('no/such')} does not exist; create it first\n`,
    );
    mkdirSync(at('afolder'));
    const folder = await striaHere(['run', ...TINY_SETS, '--steps', '5', '--save', at('afolder')]);
    expect(folder.status).toBe(2);
    expect(folder.stderr).toBe(`stria run: error: --save ${at('afolder')} is a folder; give a file name\n`);
  });

  it('refuses a run that would never end, naming the number of steps', async () => {
    const tiny = await striaHere(['run', ...TINY_SETS, '--set', 'dt=1e-300', '--set', 'cfl=0', '--until', '1']);
    expect(tiny.status).toBe(2);
    expect(tiny.stderr).toMatch(
      /--until 1 means a step count of at least 1e\+300 at dt = 1e-300, beyond the most a run may count, 2147483647/,
    );
    const many = await striaHere(['run', ...TINY_SETS, '--steps', '1e20']);
    expect(many.status).toBe(2);
    expect(many.stderr).toMatch(/--steps 1e\+20 is beyond the most a run may count, 2147483647/);
  });
});

const SPEC = {
  base: TINY,
  vary: [{ param: 'beta', values: [5, 20] }],
  length: { until: 4 },
  average: 2,
  sampleEvery: 0.5,
  fits: { resamples: 50 },
};

describe('stria sweep and merge keep one writer per directory and trust no edited line', () => {
  const spec = at('spec.json');
  writeFileSync(spec, JSON.stringify(SPEC));
  const lines = (out: string) => readFileSync(join(out, 'runs.jsonl'), 'utf8').split('\n').filter(Boolean);

  it('refuses a second sweep into a directory while the first runs, and both together run each run once', async () => {
    const out = at('busy');
    // Long enough (four runs of 600 steps on one worker) for the second to start while it runs.
    const long = at('long.json');
    writeFileSync(
      long,
      JSON.stringify({ ...SPEC, vary: [{ param: 'beta', values: [5, 10, 20, 40] }], length: { until: 30 } }),
    );
    await striaHere(['sweep', '--help']); // load the command in this process first
    const first = striaAsync(['sweep', long, '--out', out, '--jobs', '1']);
    const lock = join(out, '.stria.lock');
    await expect.poll(() => existsSync(lock), { timeout: 30_000, interval: 5 }).toBe(true);
    // In this process, so that it starts at once, while the first holds the lock.
    const second = await striaHere(['sweep', long, '--out', out, '--jobs', '1']);
    expect(second.status).toBe(2);
    expect(second.stderr).toMatch(
      new RegExp(
        `${out} is in use by stria sweep \\(process ${first.child.pid} on ${hostname()}, since .*\\): one sweep per directory`,
      ),
    );
    expect((await first.done).status).toBe(0);
    expect(existsSync(lock)).toBe(false);
    expect(lines(out)).toHaveLength(4);
  });

  it("takes over a lock left by a process that is gone, and refuses one of another machine's", () => {
    const out = at('stale');
    mkdirSync(out);
    const gone = spawnSync(process.execPath, ['-e', '0']).pid; // a process that has ended
    writeFileSync(
      join(out, '.stria.lock'),
      JSON.stringify({ pid: gone, host: hostname(), since: '2026-01-01T00:00:00Z', command: 'stria sweep' }),
    );
    const r = stria(['sweep', spec, '--out', out, '--jobs', '1']);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toContain(`removed the lock of process ${gone} on ${hostname()}, which is no longer running`);
    writeFileSync(
      join(out, '.stria.lock'),
      JSON.stringify({ pid: 1, host: 'elsewhere', since: '2026-01-01T00:00:00Z', command: 'stria sweep' }),
    );
    const other = stria(['sweep', spec, '--out', out, '--jobs', '1']);
    expect(other.status).toBe(2);
    expect(other.stderr).toMatch(
      /in use by stria sweep \(process 1 on elsewhere, .*remove .*\.stria\.lock if that sweep is no longer running/,
    );
  });

  it('refuses a journal line changed after it was written, naming the file and line', () => {
    const out = at('edited');
    expect(stria(['sweep', spec, '--out', out, '--jobs', '1']).status).toBe(0);
    const text = lines(out);
    const record = JSON.parse(text[1]);
    record.summary.u_rms *= 2;
    writeFileSync(join(out, 'runs.jsonl'), `${text[0]}\n${JSON.stringify(record)}\n`);
    for (const r of [stria(['sweep', spec, '--out', out]), stria(['merge', out, '--out', at('edited-merged')])]) {
      expect(r.status).not.toBe(0);
      expect(r.stderr).toMatch(/runs\.jsonl:2: not a sweep record: digest: does not match the line/);
    }
    expect(parseSweepRecord(text[0]).id).toBeTruthy();
  });

  it('merges into a directory holding other runs only when told', () => {
    const a = at('merge-a');
    expect(stria(['sweep', spec, '--out', a, '--jobs', '1']).status).toBe(0);
    const other = at('merge-other');
    expect(stria(['sweep', spec, '--out', other, '--jobs', '1', '--shard', '0/2']).status).toBe(0);
    const before = readFileSync(join(other, 'runs.jsonl'), 'utf8');
    const r = stria(['merge', a, '--out', other]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(
      /--out .*merge-other holds runs\.jsonl of its own: add it to the directories to merge, or give --overwrite to replace it/,
    );
    expect(readFileSync(join(other, 'runs.jsonl'), 'utf8')).toBe(before);
    expect(stria(['merge', a, other, '--out', other]).status).toBe(0);
    expect(stria(['merge', a, '--out', other, '--overwrite']).status).toBe(0);
  });
});
