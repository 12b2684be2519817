import { appendFileSync, cpSync, existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { resultKey, parseSweepRecord, sealRecord, type SweepRecord } from '../../lib/sweep/sweepRecord';
import { parseCsv } from '../../lib/io/csv';
import { scratchDir, stria, striaAsync, striaHere, TINY } from './support/stria';

/** Two values of β × two seeds at 32², 400 steps each: the smallest sweep with every feature. */
const SPEC = {
  format: 'stria-sweep',
  version: 1,
  base: TINY,
  vary: [{ param: 'beta', values: [5, 20] }],
  replicas: 2,
  length: { until: 20 },
  average: 10,
  sampleEvery: 0.5,
  fits: { resamples: 300, seed: 7 },
};

const dir = scratchDir('sweep');
const spec = join(dir, 'spec.json');
writeFileSync(spec, JSON.stringify(SPEC, null, 2));

const records = (d: string): SweepRecord[] =>
  readFileSync(join(d, 'runs.jsonl'), 'utf8').split('\n').filter(Boolean).map(parseSweepRecord);
const byId = (rs: SweepRecord[]) => new Map(rs.map((r) => [r.id, resultKey(r)]));
const withoutWall = (d: string) =>
  (JSON.parse(readFileSync(join(d, 'table.json'), 'utf8')) as Record<string, unknown>[]).map(
    ({ wall_seconds: _, ...rest }) => rest,
  );

let reference: SweepRecord[];

beforeAll(() => {
  const r = stria(['sweep', spec, '--out', join(dir, 'all'), '--jobs', '2']);
  expect(r.status, r.stderr).toBe(0);
  reference = records(join(dir, 'all'));
});

describe('stria sweep', () => {
  it('runs every point and seed once and writes the table and the fits', () => {
    expect(reference).toHaveLength(4);
    expect(new Set(reference.map((r) => r.id)).size).toBe(4);
    expect(reference.map((r) => [r.point.beta, r.seed]).sort()).toEqual([
      [20, 1],
      [20, 2],
      [5, 1],
      [5, 2],
    ]);
    for (const r of reference)
      expect(r).toMatchObject({ status: 'done', stopped: 'until', plan: { average: 10, sampleEvery: 0.5 } });
    const csv = parseCsv(readFileSync(join(dir, 'all', 'table.csv'), 'utf8'));
    expect(csv.header.slice(0, 7)).toEqual(['id', 'index', 'beta', 'replica', 'seed', 'status', 'stopped']);
    expect(csv.header).toEqual(
      expect.arrayContaining(['u_rms', 'jet_spacing', 'k_rhines', 'rhines_length', 'balance_velocity', 'wall_seconds']),
    );
    expect(csv.rows.map((row) => row[1])).toEqual(['0', '1', '2', '3']);
    const fits = JSON.parse(readFileSync(join(dir, 'all', 'fits.json'), 'utf8'));
    expect(fits.fit_options).toEqual({ resamples: 300, seed: 7 });
    expect(fits.jet_spacing_vs_rhines_length).toHaveProperty('exponent_ci');
    // Every run has ε/μ = 1: one distinct x, which the fit reports instead of inventing a slope.
    expect(fits.u_rms_vs_balance_velocity.error).toMatch(/same x/);
  });

  it('skips finished runs when run again', () => {
    const r = stria(['sweep', spec, '--out', join(dir, 'all')]);
    expect(r.status).toBe(0);
    expect(r.stderr).toMatch(/4 runs, 4 already finished, 0 to run/);
    expect(records(join(dir, 'all'))).toHaveLength(4);
  });

  it('resumes after a real kill without repeating a run', async () => {
    const out = join(dir, 'killed');
    const { child, done } = striaAsync(['sweep', spec, '--out', out, '--jobs', '1']);
    const log = join(out, 'runs.jsonl');
    await new Promise<void>((resolve, reject) => {
      const poll = setInterval(() => {
        if (existsSync(log) && readFileSync(log, 'utf8').includes('\n')) {
          clearInterval(poll);
          child.kill('SIGKILL');
          resolve();
        }
      }, 10);
      setTimeout(() => reject(new Error('no run finished in 30 s')), 30_000);
    });
    const killed = await done;
    expect(killed.signal).toBe('SIGKILL');
    const before = records(out);
    expect(before.length).toBeGreaterThanOrEqual(1);
    expect(before.length).toBeLessThan(4);
    // As if the kill had come in the middle of writing a line.
    appendFileSync(log, '{"format":"stria-sweep-run","vers');
    const r = stria(['sweep', spec, '--out', out, '--jobs', '1']);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/dropped an unfinished last line/);
    expect(r.stderr).toMatch(new RegExp(`${before.length} already finished, ${4 - before.length} to run`));
    const after = records(out);
    expect(after).toHaveLength(4);
    expect(new Set(after.map((x) => x.id)).size).toBe(4);
    expect(byId(after)).toEqual(byId(reference));
  });

  it('gives, sharded and merged, the same runs bit for bit as unsharded', async () => {
    const shards = [0, 1].map((i) =>
      striaAsync(['sweep', spec, '--out', join(dir, `shard${i}`), '--shard', `${i}/2`, '--jobs', '1']),
    );
    for (const s of shards) expect((await s.done).status).toBe(0);
    expect(
      records(join(dir, 'shard0'))
        .map((r) => r.index)
        .sort(),
    ).toEqual([0, 2]);
    expect(
      records(join(dir, 'shard1'))
        .map((r) => r.index)
        .sort(),
    ).toEqual([1, 3]);
    const merged = join(dir, 'merged');
    const m = stria(['merge', join(dir, 'shard0'), join(dir, 'shard1'), '--out', merged]);
    expect(m.status, m.stderr).toBe(0);
    expect(byId(records(merged))).toEqual(byId(reference));
    expect(withoutWall(merged)).toEqual(withoutWall(join(dir, 'all')));
    expect(readFileSync(join(merged, 'fits.json'), 'utf8')).toBe(readFileSync(join(dir, 'all', 'fits.json'), 'utf8'));
  });

  it('refuses to merge records of one run that disagree, naming the run, and writes nothing', () => {
    const other = join(dir, 'tampered');
    cpSync(join(dir, 'all'), other, { recursive: true });
    const lines = readFileSync(join(other, 'runs.jsonl'), 'utf8').split('\n');
    // Another result for the same run, as a different Stria would compute it: a whole line, sealed.
    const { digest: _, ...parsed } = JSON.parse(lines[0]);
    const changed = sealRecord({
      ...parsed,
      summary: { ...parsed.summary, u_rms: parsed.summary.u_rms * (1 + 2 ** -52) },
    });
    lines[0] = JSON.stringify(changed);
    writeFileSync(join(other, 'runs.jsonl'), lines.join('\n'));
    const out = join(dir, 'conflict');
    const r = stria(['merge', join(dir, 'all'), other, '--out', out]);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain(`run ${changed.id} differs between`);
    expect(r.stderr).toMatch(/summary\.u_rms/);
    expect(existsSync(out)).toBe(false);
  });

  it('refuses a malformed spec naming the field, and bad sweep options', async () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ ...SPEC, vary: [{ param: 'beta', logRange: { from: 1, to: 10, count: 1 } }] }));
    const r = stria(['sweep', bad]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/bad\.json: vary\.0\.logRange\.count: count: must be ≥ 2/);
    expect((await striaHere(['sweep', spec, '--shard', '2/2'])).stderr).toMatch(
      /--shard "2\/2": the shard index counts from 0/,
    );
    expect((await striaHere(['sweep', spec, '--jobs', '0'])).stderr).toMatch(/--jobs needs a positive whole number/);
    expect((await striaHere(['merge', join(dir, 'all')])).stderr).toMatch(/--out DIR is required/);
    expect((await striaHere(['sweep'])).status).toBe(2);
  });
});
