import type { ModelParams } from './params';
import type { RandomState } from './randomStream';

export const CHECKPOINT_FORMAT = 'stria-checkpoint';
export const CHECKPOINT_VERSION = 1;

/**
 * Everything a run needs to continue bit for bit: parameters, clock, the adaptive step in use, the
 * random generator's state and the PV anomaly spectrum (half-plane layout of grid.ts); with two layers
 * (params.layers = 2) the upper layer's spectrum followed by the lower layer's, twice the length.
 */
export interface Checkpoint {
  format: typeof CHECKPOINT_FORMAT;
  version: typeof CHECKPOINT_VERSION;
  params: ModelParams;
  time: number;
  steps: number;
  dt: number;
  rng: RandomState;
  qHat: Float64Array;
}
