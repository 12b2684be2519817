import type { DetectedJet, JetDetection, StaircaseDetection } from '../lib/analysis/jetDetector';
import type { Jet, JetFinder, JetReport } from '../lib/analysis/jets';
import type { MeanProfile } from '../lib/analysis/runMonitor';
import type { WindowReport } from '../lib/analysis/timeMean';
import type { ZonalMeans } from '../lib/analysis/zonalMean';
import type { JetMark, StaircaseMark, ZonalPayload } from './diagnosticsApi';

/** Jets as marks (positions in [0, Ly)), with the eddy forcing of each core from the u′v′ of the same profiles. */
export function jetMarks(jets: readonly (Jet | DetectedJet)[], finder: JetFinder, upvp: Float64Array): JetMark[] {
  return jets.map((j) => ({
    y: j.y,
    speed: j.speed,
    ySouth: j.ySouth,
    yNorth: j.yNorth,
    coreForcing: finder.coreConvergence(j, upvp),
  }));
}

export function staircaseMark(s: StaircaseDetection | null): StaircaseMark | null {
  return s && s.index !== null && s.rho !== null
    ? {
        edges: s.edges.slice(),
        levels: s.levels.slice(),
        widths: s.widths.slice(),
        index: s.index,
        indexStderr: s.indexStderr,
        rho: s.rho,
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
  jets: JetDetection;
  latestJets: JetReport;
  staircase: StaircaseDetection | null;
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
    jets: jetMarks(z.jets.jets, z.finder, z.mean.upvp),
    jetVerdict: z.jets.verdict,
    jetReason: z.jets.reason,
    jetsNow: jetMarks(z.latestJets.jets, z.finder, z.latest.upvp),
    meanJetSpacing: z.jets.meanSpacing,
    meanJetSpacingStderr: z.jets.spacingStderr,
    staircase: staircaseMark(z.staircase),
  };
  const { y, ubar, qtot, convUpvp, meanUbar, meanQtot, meanConvUpvp } = payload;
  return {
    payload,
    buffers: [y, ubar, qtot, convUpvp, meanUbar, meanQtot, meanConvUpvp].map((a) => a.buffer as ArrayBuffer),
  };
}
