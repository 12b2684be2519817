import type { Component } from 'svelte';
import type { SimulationClient } from '../simulation.svelte';
import BudgetView from './BudgetView.svelte';
import FieldView from './FieldView.svelte';
import ScaleLadderView from './ScaleLadderView.svelte';

/** What every view is given: the client, from which it reads the latest snapshot and the history. */
export interface ViewProps {
  sim: SimulationClient;
}

/** One view of the run: its id (stable, used in tests and links), tab title and what it shows. */
export interface ViewEntry {
  id: string;
  title: string;
  summary: string;
  component: Component<ViewProps>;
}

/**
 * The views the app offers, in tab order. A view is listed only once it works; adding one is adding
 * an entry here (the tabs, keyboard handling and layout take it from this list).
 */
export const VIEWS: readonly ViewEntry[] = [
  { id: 'field', title: 'Field', summary: 'ζ, q, ψ, u or v on the grid, north up', component: FieldView },
  { id: 'budget', title: 'Budget', summary: 'energy and enstrophy budgets over time', component: BudgetView },
  { id: 'scales', title: 'Scale ladder', summary: 'the wavenumbers of the run, predicted and measured', component: ScaleLadderView },
];
