import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/**
 * The `ncgen` command of the NetCDF reference library (Debian package netcdf-bin): it writes NetCDF-3
 * and netCDF-4 files from CDL text, so the readers are tested on files the reference library made,
 * not on files of our own writer. Present in CI; on a machine without it the ncgen tests skip with a
 * message, except under CI (the CI environment variable), where its absence is a failure.
 */
export const hasNcgen = !spawnSync('ncgen', ['-h'], { encoding: 'utf8' }).error;
export const mustHaveNcgen = !!process.env.CI;
export const NCGEN_MISSING = 'ncgen not found (install it with: apt-get install -y netcdf-bin)';
/** Run the ncgen tests: ncgen is here, or CI demands it (then they fail without it). */
export const runNcgen = hasNcgen || mustHaveNcgen;

if (!hasNcgen && !mustHaveNcgen) console.warn(`test: ${NCGEN_MISSING}; skipping the tests on ncgen-written files`);

export type NcgenKind = 'nc3' | 'nc6' | 'nc4' | 'nc7';

/** The bytes of the file ncgen writes from `cdl` in format `kind` (nc3 classic, nc6 64-bit offset, nc4 netCDF-4, nc7 netCDF-4 classic model). */
export function ncgen(cdl: string, kind: NcgenKind): Uint8Array {
  if (!hasNcgen) throw new Error(NCGEN_MISSING);
  const dir = mkdtempSync(join(tmpdir(), 'stria-ncgen-'));
  try {
    const src = join(dir, 'in.cdl');
    const out = join(dir, 'out.nc');
    writeFileSync(src, cdl);
    const r = spawnSync('ncgen', ['-k', kind, '-o', out, src], { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`ncgen -k ${kind} failed (${r.status}): ${r.stderr}`);
    return new Uint8Array(readFileSync(out));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
