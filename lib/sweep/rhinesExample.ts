import type { SweepSpecSchema } from './sweepSpec';
import type * as v from 'valibot';

/**
 * The sweep that shows the Rhines scaling of jets: the default scenario (128², stirred at k_f = 24,
 * μ = ε = 0.02, a scenario of Stria's own) at five β from 10 to 160, each run from rest to t = 250
 * and averaged over its second half (125 time units: 2.5 drag times, well after the spin-up time
 * 1/(2μ) = 25). Across a sixteenfold β the Rhines length 2π/k_R changes by 2 at fixed U, enough for
 * the fitted exponent's interval to exclude 0. About four minutes of two cores (docs/significance.md;
 * README "A sweep, walked through"; `npm run bench -- --scaling-law` runs it and reports the fit).
 */
export const RHINES_EXAMPLE: v.InferInput<typeof SweepSpecSchema> = {
  format: 'stria-sweep',
  version: 1,
  preset: 'jets',
  vary: [{ param: 'beta', logRange: { from: 10, to: 160, count: 5 } }],
  length: { until: 250 },
  average: 125,
};
