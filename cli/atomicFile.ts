import { closeSync, fsyncSync, openSync, readdirSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { isRunning } from './processes';

/**
 * Replace a file so that it is, at every instant and whatever kills the process, either the old
 * file or the new one, never a mixture: write a temporary file in the same directory (a rename is
 * atomic only within one file system), flush it to the disk (fsync), rename it over the old name,
 * then flush the directory so the rename itself survives a crash of the machine. A reader sees a
 * complete file under the name; a process killed midway leaves the old file and a stray temporary.
 *
 * The temporary is `.NAME.PID.tmp`: unique per process, so two processes never write into the same
 * temporary, and recognisable, so strays of dead processes are swept by `removeStaleTemporaries`.
 */
export function writeFileAtomic(path: string, data: string | Uint8Array): void {
  const target = resolve(path);
  const tmp = temporaryName(target, process.pid);
  const bytes = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
  const fd = openSync(tmp, 'w', 0o644);
  try {
    for (let off = 0; off < bytes.length;) off += writeSync(fd, bytes, off, bytes.length - off);
    fsyncSync(fd);
  } catch (e) {
    closeSync(fd);
    unlinkQuietly(tmp);
    throw e;
  }
  closeSync(fd);
  try {
    renameSync(tmp, target);
  } catch (e) {
    unlinkQuietly(tmp);
    throw e;
  }
  syncDirectory(dirname(target));
}

export function temporaryName(target: string, pid: number): string {
  return join(dirname(target), `.${basename(target)}.${pid}.tmp`);
}

/** Flush a directory's entries (the rename); some file systems refuse fsync on a directory, harmlessly. */
function syncDirectory(dir: string): void {
  let fd: number;
  try {
    fd = openSync(dir, 'r');
  } catch {
    return;
  }
  try {
    fsyncSync(fd);
  } catch {
    // EINVAL/EISDIR/EPERM: the platform does not sync directories this way; the rename stands.
  } finally {
    closeSync(fd);
  }
}

function unlinkQuietly(path: string): void {
  try {
    unlinkSync(path);
  } catch {
    // Already gone.
  }
}

/** Remove temporaries of `path` left by processes that are no longer running; returns their names. */
export function removeStaleTemporaries(path: string): string[] {
  const target = resolve(path);
  const prefix = `.${basename(target)}.`;
  let names: string[];
  try {
    names = readdirSync(dirname(target));
  } catch {
    return [];
  }
  const removed: string[] = [];
  for (const name of names) {
    if (!name.startsWith(prefix) || !name.endsWith('.tmp')) continue;
    const pid = Number(name.slice(prefix.length, -'.tmp'.length));
    if (!Number.isInteger(pid) || pid <= 0 || pid === process.pid || isRunning(pid)) continue;
    unlinkQuietly(join(dirname(target), name));
    removed.push(name);
  }
  return removed;
}
