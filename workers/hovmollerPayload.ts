import type { HovmollerAccumulator } from '../lib/analysis/hovmoller';
import { trackJets } from '../lib/analysis/jetTracking';
import type { HovmollerPayload } from './diagnosticsApi';

/**
 * The Hovmöller record of ū(y, t) as it stands, copied for transfer, with the jets followed through
 * it (jetTracking.ts, default criteria). Tracks of a single column are left out: they show nothing.
 */
export function hovmollerPayload(acc: HovmollerAccumulator): { payload: HovmollerPayload; buffers: ArrayBuffer[] } {
  const rec = acc.snapshot();
  const found = trackJets(rec);
  const tracks = found.tracks
    .filter((tr) => tr.t.length > 1)
    .map((tr) => ({ t: Float64Array.from(tr.t), y: Float64Array.from(tr.y) }));
  const payload: HovmollerPayload = {
    ny: rec.ny,
    Ly: rec.Ly,
    columns: rec.columns,
    samplesPerColumn: rec.samplesPerColumn,
    t: rec.t,
    data: rec.data,
    tracks,
    mergers: found.mergers.map((e) => ({ t: e.t, y: e.y })),
    splits: found.splits.map((e) => ({ t: e.t, y: e.y })),
  };
  const buffers = [
    rec.t.buffer,
    rec.data.buffer,
    ...tracks.flatMap((tr) => [tr.t.buffer, tr.y.buffer]),
  ] as ArrayBuffer[];
  return { payload, buffers };
}
