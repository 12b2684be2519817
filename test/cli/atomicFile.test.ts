import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { removeStaleTemporaries, temporaryName, writeFileAtomic } from '../../cli/atomicFile';
import { scratchDir } from './support/stria';

const dir = scratchDir('atomic');

describe('atomic replacement of a file', () => {
  it('replaces the whole file and leaves no temporary', () => {
    const path = join(dir, 'ck.json');
    writeFileAtomic(path, 'old');
    writeFileAtomic(path, 'x'.repeat(100_000));
    expect(readFileSync(path, 'utf8')).toBe('x'.repeat(100_000));
    expect(readdirSync(dir).filter((n) => n.endsWith('.tmp'))).toEqual([]);
  });

  it('sweeps the temporaries of dead processes only', () => {
    const path = join(dir, 'sweep.json');
    // A pid that has surely ended: a child that has run and exited.
    const dead = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], {
      encoding: 'utf8',
    }).stdout;
    writeFileSync(temporaryName(path, Number(dead)), 'half a checkpoint');
    writeFileSync(temporaryName(path, process.pid), 'mine');
    writeFileSync(join(dir, '.sweep.json.notapid.tmp'), 'not ours');
    expect(removeStaleTemporaries(path)).toEqual([`.sweep.json.${dead}.tmp`]);
    expect(existsSync(temporaryName(path, process.pid))).toBe(true);
    expect(existsSync(join(dir, '.sweep.json.notapid.tmp'))).toBe(true);
  });

  it('leaves the old file when the write fails', () => {
    const path = join(dir, 'keep.json');
    writeFileAtomic(path, 'good');
    expect(() => writeFileAtomic(join(dir, 'no-such-dir', 'keep.json'), 'new')).toThrow(/ENOENT/);
    expect(readFileSync(path, 'utf8')).toBe('good');
  });
});
