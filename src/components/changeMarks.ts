import type { ParamChange } from '../../workers/simulationApi';
import type { ChartMark } from './chartMarks';

/** The colour of parameter changes on every time axis (the brown of the app's warnings). */
export const CHANGE_COLOUR = '#8a5a1e';

/** A change in words, for its mark: "β changed", "new grid". */
export function changeLabel(c: ParamChange): string {
  if (c.how === 'regrid') return 'new grid';
  return `${c.keys.join(', ')} changed`;
}

/**
 * The changes of parameters of a run as marks on a time axis (scale x): a dashed line at each, so a
 * reader of a time series sees where the run's settings changed.
 */
export function changeMarks(changes: readonly ParamChange[], scale = 'x'): ChartMark[] {
  return changes.map((c) => ({ scale, value: c.time, label: changeLabel(c), colour: CHANGE_COLOUR, dash: [3, 3] }));
}
