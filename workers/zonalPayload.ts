import type { JetFinder, JetReport } from '../lib/analysis/jets';
import type { MeanProfile } from '../lib/analysis/runMonitor';
import type { StaircaseFit } from '../lib/analysis/staircase';
import type { WindowReport } from '../lib/analysis/timeMean';
import type { ZonalMeans } from '../lib/analysis/zonalMean';
import type { JetMark, StaircaseMark, ZonalPayload } from './diagnosticsApi';

/** The jets of a report as marks (positions wrapped into [0, Ly)), with the eddy forcing of each core from the u′v′ of the same profiles. */
export function jetMarks(report: JetReport, finder: JetFinder, upvp: Float64Array): JetMark[] {
  return report.jets.map((j) => ({
    y: j.y,
    speed: j.speed,
    ySouth: j.ySouth,
    yNorth: j.yNorth,
    coreForcing: finder.coreConvergence(j, upvp),
  }));
}

export function staircaseMark(fit: StaircaseFit | null): StaircaseMark | null {
  return fit
    ? {
        edges: fit.edges.slice(),
        levels: fit.levels.slice(),
        widths: fit.widths.slice(),
        index: fit.index,
        rho: fit.rho,
      }
    : null;
}

export interface ZonalPayloadInput {
  y: Float64Array;
  Ly: number;
  beta: number;
  time: number;
  latest: ZonalMeans;
  mean: Record<MeanProfile, Float64Array>;
  window: WindowReport;
  meanJets: JetReport;
  latestJets: JetReport;
  staircase: StaircaseFit | null;
  finder: JetFinder;
}

/** Copies of the profiles (the monitor reuses its buffers), ready to transfer, and their buffers. */
export function zonalPayload(z: ZonalPayloadInput): { payload: ZonalPayload; buffers: ArrayBuffer[] } {
  const payload: ZonalPayload = {
    y: z.y.slice(),
    Ly: z.Ly,
    beta: z.beta,
    time: z.time,
    ubar: z.latest.ubar.slice(),
    qtot: z.latest.qtot.slice(),
    convUpvp: z.latest.convUpvp.slice(),
    meanUbar: z.mean.ubar.slice(),
    meanQtot: z.mean.qtot.slice(),
    meanConvUpvp: z.mean.convUpvp.slice(),
    window: { ...z.window },
    jets: jetMarks(z.meanJets, z.finder, z.mean.upvp),
    jetsNow: jetMarks(z.latestJets, z.finder, z.latest.upvp),
    meanJetSpacing: z.meanJets.meanSpacing,
    staircase: staircaseMark(z.staircase),
  };
  const { y, ubar, qtot, convUpvp, meanUbar, meanQtot, meanConvUpvp } = payload;
  return {
    payload,
    buffers: [y, ubar, qtot, convUpvp, meanUbar, meanQtot, meanConvUpvp].map((a) => a.buffer as ArrayBuffer),
  };
}
