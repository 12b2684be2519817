import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { afterAll } from 'vitest';

/** The launcher as users run it: `node cli/stria.js ...`, a separate process, stdio captured. */
export const STRIA = fileURLToPath(new URL('../../../cli/stria.js', import.meta.url));

export interface Result {
  status: number | null;
  stdout: string;
  stderr: string;
  /** The signal that ended the process, if one did. */
  signal?: NodeJS.Signals | null;
}

export function stria(args: readonly string[], cwd?: string): Result {
  const r = spawnSync(process.execPath, [STRIA, ...args], {
    encoding: 'utf8',
    cwd,
    env: { ...process.env, STRIA_DEBUG: '' },
  });
  if (r.error) throw r.error;
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** The same, without blocking: for runs side by side and for killing a run midway. */
export function striaAsync(args: readonly string[], cwd?: string): { child: ChildProcess; done: Promise<Result> } {
  const child = spawn(process.execPath, [STRIA, ...args], { cwd, stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  child.stdout!.on('data', (d) => (stdout += d));
  child.stderr!.on('data', (d) => (stderr += d));
  const done = new Promise<Result>((resolve, reject) => {
    child.on('error', reject);
    child.on('close', (status, signal) => resolve({ status, stdout, stderr, signal }));
  });
  return { child, done };
}

/** A scratch directory removed after the file's tests. */
export function scratchDir(name: string): string {
  const dir = mkdtempSync(join(tmpdir(), `stria-${name}-`));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  return dir;
}

/** Tiny, fast parameters: 32 × 32, forcing at k = 8, strong drag (spin-up 1/(2μ) = 10). */
export const TINY = {
  nx: 32,
  ny: 32,
  kf: 8,
  dkf: 1.5,
  beta: 10,
  mu: 0.05,
  eps: 0.05,
  nu: 1e-8,
  nu_order: 4,
  dt: 0.05,
  cfl: 0.8,
};
export const TINY_SETS = Object.entries(TINY).flatMap(([k, v]) => ['--set', `${k}=${v}`]);

/**
 * `stria` called in this process through cli/main.ts, for the many quick cases (usage errors, help)
 * where starting Node and the TypeScript loader each time would cost most of the test's time. The
 * launcher itself is covered by the tests that spawn it.
 */
export async function striaHere(args: readonly string[]): Promise<Result> {
  const { main } = await import('../../../cli/main');
  let stdout = '';
  let stderr = '';
  const sink = (add: (s: string) => void) => new Writable({ write: (chunk, _enc, cb) => (add(String(chunk)), cb()) });
  const status = await main(args, {
    out: sink((s) => (stdout += s)),
    err: sink((s) => (stderr += s)),
    argv: args,
    interrupted: () => false,
  });
  return { status, stdout, stderr };
}
