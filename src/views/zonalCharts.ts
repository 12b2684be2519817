import type uPlot from 'uplot';
import { ChartMarks } from '../components/chartMarks';
import type { ZonalPayload } from '../../workers/diagnosticsApi';
import { profileChartOptions, profileSeries } from './profileChart';
import { staircaseProfile } from './staircaseProfile';

/** Colours of the Zonal view: the latest sample thin and grey, the time mean bold; jets in the eastward red of the field maps. */
export const ZONAL_COLOURS = {
  latest: '#8c8c8c',
  mean: '#1b1b1b',
  conv: '#c8641e',
  stairs: '#1f5f9f',
  beta: '#7a7a7a',
  jet: 'rgba(177, 41, 56, 0.75)',
  edge: 'rgba(31, 95, 159, 0.7)',
} as const;

export type ZonalChartId = 'ubar' | 'conv' | 'pv';

/** The three profile charts of the Zonal view: options (built once per domain) and marks. */
export class ZonalCharts {
  readonly marks: Record<ZonalChartId, ChartMarks> = {
    ubar: new ChartMarks(),
    conv: new ChartMarks(),
    pv: new ChartMarks(),
  };
  readonly options: Record<ZonalChartId, Omit<uPlot.Options, 'width' | 'height'>>;
  private stairs = new Float64Array(0);

  constructor(Ly: number) {
    const c = ZONAL_COLOURS;
    const plug = (id: ZonalChartId) => [this.marks[id].plugin()];
    this.options = {
      ubar: profileChartOptions(
        'Zonal-mean zonal velocity ū',
        'ū [L T⁻¹]',
        Ly,
        [profileSeries('latest sample', c.latest, 1), profileSeries('time mean', c.mean, 2)],
        plug('ubar'),
      ),
      conv: profileChartOptions(
        'Eddy momentum flux convergence',
        '−∂y(u′v′) [L T⁻²]',
        Ly,
        [{ ...profileSeries('latest sample', c.latest, 1), show: false }, profileSeries('time mean', c.conv, 2)],
        plug('conv'),
      ),
      pv: profileChartOptions(
        'Total PV q̄ + βy and its staircase',
        'q̄ + βy [T⁻¹]',
        Ly,
        [
          profileSeries('latest sample', c.latest, 1),
          profileSeries('time mean', c.mean, 2),
          profileSeries('fitted staircase', c.stairs, 1.5),
          profileSeries('βy (unmixed)', c.beta, 1, [4, 4]),
        ],
        plug('pv'),
      ),
    };
  }

  /** Columnar data of the three charts for a payload; sets the jet and edge marks. */
  update(z: ZonalPayload): Record<ZonalChartId, uPlot.AlignedData> {
    const jets = z.jets.map((j) => ({ value: j.y, colour: ZONAL_COLOURS.jet, dash: [5, 3] }));
    this.marks.ubar.marks = jets;
    this.marks.conv.marks = jets;
    this.marks.pv.marks = (z.staircase?.edges ?? []).map((e) => ({
      value: e,
      colour: ZONAL_COLOURS.edge,
      dash: [2, 3],
    }));
    const n = z.y.length;
    if (this.stairs.length !== n) this.stairs = new Float64Array(n);
    const stairs = z.staircase ? staircaseProfile(z.y, z.staircase, z.beta, z.Ly, this.stairs) : null;
    // βy shifted to the mean of the time-mean PV, so the unmixed reference sits on the profile.
    let offset = 0;
    for (let j = 0; j < n; j++) offset += (z.meanQtot[j] - z.beta * z.y[j]) / n;
    const betaY = Array.from(z.y, (y) => z.beta * y + offset);
    return {
      ubar: [z.y, z.ubar, z.meanUbar],
      conv: [z.y, z.convUpvp, z.meanConvUpvp],
      pv: [z.y, z.qtot, z.meanQtot, stairs ? Array.from(stairs) : Array.from({ length: n }, () => null), betaY],
    };
  }
}
