import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/**
 * The `ncdump` command of the NetCDF reference library (Debian package netcdf-bin), an independent
 * check that written files parse. Present in CI; on a machine without it the ncdump tests skip with
 * a message, except under CI (the CI environment variable), where its absence is a failure.
 */
export const hasNcdump = !spawnSync('ncdump', [], { encoding: 'utf8' }).error;
export const mustHaveNcdump = !!process.env.CI;
export const NCDUMP_MISSING = 'ncdump not found (install it with: apt-get install -y netcdf-bin)';

if (!hasNcdump && !mustHaveNcdump) console.warn(`test/io: ${NCDUMP_MISSING}; skipping the ncdump checks`);

/** Runs ncdump with `args` on the given file bytes; returns stdout, throws with stderr on failure. */
export function ncdump(args: string[], bytes: Uint8Array, fileName = 'file.nc'): string {
  if (!hasNcdump) throw new Error(NCDUMP_MISSING);
  const dir = mkdtempSync(join(tmpdir(), 'stria-ncdump-'));
  try {
    const path = join(dir, fileName);
    writeFileSync(path, bytes);
    const r = spawnSync('ncdump', [...args, path], { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`ncdump ${args.join(' ')} failed (${r.status}): ${r.stderr}`);
    return r.stdout;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
