import { Forcing } from './forcing';
import type { Grid } from './grid';
import { LinearOperator } from './linearOperator';
import { NonlinearTerm } from './nonlinearTerm';
import type { ModelParams } from './params';
import type { RandomStream } from './randomStream';
import { RealTransform2D } from './realTransform2D';
import type { Float64Alloc } from './sharedArena';
import { Stepper } from './stepper';
import { TwoLayerLinearOperator } from './twoLayerLinear';
import { TwoLayerNonlinearTerm } from './twoLayerNonlinear';
import { TwoLayerStepper } from './twoLayerStepper';

/** What a step is made of: the stepper and the operators it was built with. */
export interface StepParts {
  stepper: Stepper | TwoLayerStepper;
  forcing: Forcing;
  /** One layer: the model's linear operator; null with two layers. */
  lin: LinearOperator | null;
  /** Two layers: the coupled linear operator; null in one layer. */
  lin2: TwoLayerLinearOperator | null;
  /**
   * One layer on one thread: the step's transform (its arrays are the nonlinear term's work space);
   * null with two layers, or when the step is built for threads.
   */
  transform: RealTransform2D | null;
}

/**
 * Build the step of validated parameters p, its arrays from `alloc`. The Model and every helper
 * thread of its team (threadTeam.ts) build it here, in the same order, so that a helper replaying
 * the Model's shared arena (sharedArena.ts) gets the same arrays. The forcing is normalised on 1/K²
 * in one layer and on the barotropic 1/k² with two (it forces both layers alike).
 */
export function buildStepParts(
  grid: Grid,
  p: ModelParams,
  rng: RandomStream,
  alloc: Float64Alloc,
  threads = 1,
): StepParts {
  if (p.layers === 2) {
    const lin2 = new TwoLayerLinearOperator(grid, p, alloc);
    const forcing = new Forcing(grid, p, { invK2: lin2.invK2Barotropic });
    const nl2 = new TwoLayerNonlinearTerm(grid, lin2, alloc, threads);
    const stepper = new TwoLayerStepper(grid, p, lin2, nl2, forcing, rng, alloc);
    return { stepper, forcing, lin: null, lin2, transform: null };
  }
  const lin = new LinearOperator(grid, p, alloc);
  const forcing = new Forcing(grid, p, lin);
  // One row slab per thread (realTransform2D.ts): each thread's rows of the work grid in one stretch.
  const transform = new RealTransform2D(grid, true, alloc, threads);
  const nl = new NonlinearTerm(grid, lin, transform);
  const stepper = new Stepper(grid, p, lin, nl, forcing, rng, alloc);
  // A transform cut into slabs serves the step alone; the model's other verbs then build their own.
  return { stepper, forcing, lin, lin2: null, transform: threads === 1 ? transform : null };
}
