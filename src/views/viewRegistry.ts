import type { Component } from 'svelte';
import type { SimulationClient } from '../simulation.svelte';
import FieldView from './FieldView.svelte';

/** What every view is given: the client, from which it reads the latest snapshot and the history. */
export interface ViewProps {
  sim: SimulationClient;
}

/** One view of the run: its id (stable, used in tests and links), tab title and what it shows. */
export interface ViewEntry {
  id: string;
  title: string;
  summary: string;
  /** The component, loaded when the view is first opened (so the page starts on the Field view's code alone). */
  load: () => Promise<{ default: Component<ViewProps> }>;
}

/**
 * The views the app offers, in tab order. A view is listed only once it works; adding one is adding
 * an entry here (the tabs, keyboard handling and layout take it from this list). Each view tells the
 * worker which diagnostics it needs while it is shown (useNeeds.svelte.ts).
 */
export const VIEWS: readonly ViewEntry[] = [
  {
    id: 'field',
    title: 'Field',
    summary: 'ζ, q, ψ, u or v on the grid, north up',
    load: () => Promise.resolve({ default: FieldView }),
  },
  {
    id: 'zonal',
    title: 'Zonal',
    summary: 'zonal-mean profiles: ū, eddy momentum flux convergence, q̄ + βy with its staircase',
    load: () => import('./ZonalView.svelte'),
  },
  {
    id: 'hovmoller',
    title: 'Hovmöller',
    summary: 'ū(y, t) over the run, with the jets followed through it',
    load: () => import('./HovmollerView.svelte'),
  },
  {
    id: 'spectra',
    title: 'Spectra',
    summary: 'energy spectra: isotropic, zonal and residual, with reference slopes and a fit',
    load: () => import('./SpectraView.svelte'),
  },
  {
    id: 'flux',
    title: 'Flux',
    summary: 'spectral energy and enstrophy fluxes, and the eddy-to-mean conversion',
    load: () => import('./FluxView.svelte'),
  },
  {
    id: 'budget',
    title: 'Budget',
    summary: 'energy and enstrophy budgets over time',
    load: () => import('./BudgetView.svelte'),
  },
  {
    id: 'cycle',
    title: 'Energy cycle',
    summary: 'two layers: the eddies’ energy from the imposed shear to the jets and the drag, live',
    load: () => import('./EnergyCycleView.svelte'),
  },
  {
    id: 'scales',
    title: 'Scale ladder',
    summary: 'the wavenumbers of the run, predicted and measured',
    load: () => import('./ScaleLadderView.svelte'),
  },
  {
    id: 'plan',
    title: 'Plan',
    summary: 'plan an expensive run: predictions, checks, cost, and a matched run to try here',
    load: () => import('./PlanView.svelte'),
  },
  {
    id: 'sweep',
    title: 'Sweep',
    summary: 'run a small parameter sweep here, or load a command-line sweep, and check a scaling law',
    load: () => import('./SweepView.svelte'),
  },
  {
    id: 'compare',
    title: 'Compare',
    summary: 'two runs side by side, one parameter apart; or a NetCDF file of your own',
    load: () => import('./CompareView.svelte'),
  },
];
