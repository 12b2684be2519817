import { CYCLE_TERMS } from '../../lib/analysis/cycleSeries';
import type { LayerPayload } from '../../workers/layerPayload';
import { timeStamp } from './download';
import { csvFile, numbers, type DataFile } from './figureData';

/**
 * The data behind the two-layer figures (model units; suffix 1 the upper layer, 2 the lower):
 * the layers' zonal-mean profiles with the heat flux, and the energy cycle's series.
 */
export function layerProfilesData(p: LayerPayload): DataFile {
  const w = p.window;
  return csvFile(
    `stria-zonal-layers-${timeStamp(p.time)}.csv`,
    [
      numbers('y', p.y),
      numbers('ubar1_latest', p.ubar1),
      numbers('ubar1_time_mean', p.meanUbar1),
      numbers('ubar2_latest', p.ubar2),
      numbers('ubar2_time_mean', p.meanUbar2),
      numbers('qtot1_latest', p.qtot1),
      numbers('qtot1_time_mean', p.meanQtot1),
      numbers('qtot2_latest', p.qtot2),
      numbers('qtot2_time_mean', p.meanQtot2),
      numbers('heat_flux_latest', p.heat),
      numbers('heat_flux_time_mean', p.meanHeat),
    ],
    `layer profiles on ${p.y.length} points in y at t = ${p.time.toFixed(2)}` +
      (w ? `, time means over t = ${w.tStart.toFixed(2)}–${w.tEnd.toFixed(2)} (${w.count} samples)` : ''),
  );
}

/**
 * The energy cycle over time: each row a stretch of steps (its midpoint `time`), every term its
 * dt-weighted mean over them (lib/analysis/cycleSeries.ts; the latest rows, thinned to at most
 * SERIES_POINTS). Energies L² T⁻², rates L² T⁻³, the heat flux L³ T⁻².
 */
export function cycleData(p: LayerPayload): DataFile | string {
  const s = p.series;
  if (s.time.length === 0) return 'no step of the energy cycle yet';
  return csvFile(
    `stria-energy-cycle-${timeStamp(p.time)}.csv`,
    [numbers('time', s.time), ...CYCLE_TERMS.map((t) => numbers(t, s.terms[t]))],
    `the energy cycle at ${s.time.length} times from t = ${s.time[0].toFixed(2)} to ${s.time[s.time.length - 1].toFixed(2)}`,
  );
}
