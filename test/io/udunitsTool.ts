import { spawnSync } from 'node:child_process';

/**
 * The `udunits2` command of the UDUNITS-2 library (Debian package udunits-bin), the units library
 * that CF tools read `units` attributes with: an independent check that Stria's units strings mean
 * what they say. Present in CI; on a machine without it the udunits tests skip with a message, except
 * under CI (the CI environment variable), where its absence is a failure.
 */
export const hasUdunits = !spawnSync('udunits2', ['-H', '1', '-W', '1'], { encoding: 'utf8' }).error;
export const mustHaveUdunits = !!process.env.CI;
export const UDUNITS_MISSING = 'udunits2 not found (install it with: apt-get install -y udunits-bin)';

if (!hasUdunits && !mustHaveUdunits) console.warn(`test/io: ${UDUNITS_MISSING}; skipping the udunits checks`);

/**
 * One `have` in `want`, as UDUNITS reads both strings: the factor, or null when UDUNITS does not
 * recognise one of them or they are not convertible.
 */
export function udunitsFactor(have: string, want: string): number | null {
  if (!hasUdunits) throw new Error(UDUNITS_MISSING);
  const r = spawnSync('udunits2', ['-H', have, '-W', want], { encoding: 'utf8' });
  if (r.status !== 0 || /recognize|not convertible/i.test(r.stderr)) return null;
  // "    1 L = 0.001 m3"
  const m = /^\s*1 .* = ([-+0-9.eE]+) /m.exec(r.stdout);
  return m ? Number(m[1]) : null;
}
