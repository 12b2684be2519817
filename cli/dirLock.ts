import { closeSync, linkSync, openSync, readFileSync, unlinkSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { UsageError } from './args';
import { temporaryName } from './atomicFile';
import { isRunning } from './processes';

/**
 * One writer per results directory: `DIR/.stria.lock` holds the owner's process id, host, start time
 * and command while a sweep or a merge writes DIR, so a second one refuses instead of running every
 * run again and interleaving its lines with the first's journal.
 *
 * The lock is created whole or not at all: its text goes to a temporary file, which is then hard-linked
 * to the lock's name (a link to an existing name fails, atomically, on every POSIX file system, NFS
 * included), so a reader never sees a half-written lock. A lock whose process is gone (killed, the
 * machine restarted) is stale: on the same host it is removed and taken, with a message; a lock of
 * another host cannot be checked from here, and the refusal says how to remove it.
 */
export const LOCK_NAME = '.stria.lock';

interface LockOwner {
  pid: number;
  host: string;
  since: string;
  command: string;
}

export interface DirLock {
  readonly path: string;
  /** Remove the lock if it is still this process's (idempotent). */
  release(): void;
}

/** Take the lock of `dir` (which must exist) for `command`; `say` reports a stale lock removed. */
export function lockDirectory(dir: string, command: string, say: (line: string) => void): DirLock {
  const path = join(dir, LOCK_NAME);
  const me: LockOwner = { pid: process.pid, host: hostname(), since: new Date().toISOString(), command };
  for (let attempt = 0; ; attempt++) {
    if (tryCreate(path, me)) break;
    const owner = readOwner(path);
    if (owner === undefined && attempt < 5) continue; // released between our attempt and the read: again
    const stale = !!owner && owner.host === me.host && !isRunning(owner.pid);
    if (!stale || attempt > 0) {
      const who = owner
        ? `${owner.command} (process ${owner.pid} on ${owner.host}, since ${owner.since})`
        : 'a lock Stria cannot read';
      throw new UsageError(
        `${dir} is in use by ${who}: one sweep per directory (give each shard its own --out); remove ${path} if that sweep is no longer running`,
      );
    }
    unlinkQuietly(path);
    say(`removed the lock of process ${owner!.pid} on ${owner!.host}, which is no longer running (${path})`);
  }
  let held = true;
  return {
    path,
    release() {
      if (!held) return;
      held = false;
      const owner = readOwner(path);
      if (owner && owner.pid === me.pid && owner.host === me.host && owner.since === me.since) unlinkQuietly(path);
    },
  };
}

/** Create the lock with its text, or false when it exists. */
function tryCreate(path: string, owner: LockOwner): boolean {
  const tmp = temporaryName(path, process.pid);
  const fd = openSync(tmp, 'w', 0o644);
  try {
    const text = `${JSON.stringify(owner)}\n`;
    writeSync(fd, text);
  } finally {
    closeSync(fd);
  }
  try {
    linkSync(tmp, path);
    return true;
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'EEXIST') return false;
    throw e;
  } finally {
    unlinkQuietly(tmp);
  }
}

/** The owner a lock names; null when its text is not a lock; undefined when it is gone. */
function readOwner(path: string): LockOwner | null | undefined {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
    throw e;
  }
  try {
    const o = JSON.parse(text) as Partial<LockOwner>;
    if (
      Number.isInteger(o.pid) &&
      typeof o.host === 'string' &&
      typeof o.since === 'string' &&
      typeof o.command === 'string'
    )
      return o as LockOwner;
  } catch {
    // not JSON: not a lock Stria wrote whole
  }
  return null;
}

function unlinkQuietly(path: string): void {
  try {
    unlinkSync(path);
  } catch {
    // already gone
  }
}
