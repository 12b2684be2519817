import { describe, expect, it } from 'vitest';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { keptRadius } from '../../lib/model/validateParams';
import { RESCALED_NU_DIGITS, scaledHyperviscosity } from '../../lib/plan/gridHyperviscosity';

/** Damping rate of ν(−∇²)^p at k_max: ν k_max^{2p} [derived from the operator's symbol]. */
const gridRate = (p: typeof DEFAULT_PARAMS) => p.nu * Math.pow(keptRadius(p), 2 * p.nu_order);
const roundingTolerance = 0.5 * Math.pow(10, 1 - RESCALED_NU_DIGITS);

describe('hyperviscosity that follows the grid', () => {
  it('keeps the damping rate at k_max when nx and ny change', () => {
    for (const n of [32, 64, 256, 512, 1024]) {
      const next = { ...DEFAULT_PARAMS, nx: n, ny: n };
      const nu = scaledHyperviscosity(DEFAULT_PARAMS, next);
      expect(Math.abs(gridRate({ ...next, nu }) / gridRate(DEFAULT_PARAMS) - 1), `${n}`).toBeLessThan(
        roundingTolerance,
      );
    }
  });

  it('gives ν (42/85)^16 times the default at 256², the ratio of k_max under the 2/3 rule', () => {
    // k_max = ⌊n/3⌋ on a 2π domain: 42 at 128², 85 at 256² [derived].
    const nu = scaledHyperviscosity(DEFAULT_PARAMS, { nx: 256, ny: 256 });
    expect(nu).toBe(Number((3e-26 * Math.pow(42 / 85, 16)).toPrecision(RESCALED_NU_DIGITS)));
    expect(nu).toBe(3.788e-31);
  });

  it('follows a change of one axis or of the domain through k_max, and leaves ν alone when k_max stays', () => {
    expect(scaledHyperviscosity(DEFAULT_PARAMS, { nx: 256 })).toBe(DEFAULT_PARAMS.nu); // ny still limits k_max
    expect(scaledHyperviscosity(DEFAULT_PARAMS, { nx: 128, ny: 128 })).toBe(DEFAULT_PARAMS.nu);
    const wide = scaledHyperviscosity(DEFAULT_PARAMS, { Lx: 4 * Math.PI, Ly: 4 * Math.PI });
    expect(wide).toBe(Number((3e-26 * 2 ** 16).toPrecision(RESCALED_NU_DIGITS)));
    expect(scaledHyperviscosity({ ...DEFAULT_PARAMS, nu: 0 }, { nx: 256, ny: 256 })).toBe(0);
  });

  it('goes there and back to the same ν (the rounding does not drift)', () => {
    const there = scaledHyperviscosity(DEFAULT_PARAMS, { nx: 512, ny: 512 });
    const back = scaledHyperviscosity({ ...DEFAULT_PARAMS, nx: 512, ny: 512, nu: there }, { nx: 128, ny: 128 });
    expect(back).toBe(DEFAULT_PARAMS.nu);
  });
});
