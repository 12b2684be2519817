import { SnapshotPlan, type GridFields } from '../lib/analysis/snapshot';
import type { StriaRunInfo } from '../lib/io/cfGlobalAttributes';
import { SNAPSHOT_FILE, ZONAL_MEAN_FILE } from '../lib/io/cfStria';
import { snapshotFrame, zonalMeanFrame } from '../lib/io/cfStriaWriter';
import type { Model } from '../lib/model/model';
import type { RunHooks } from '../lib/sweep/monitoredRun';
import { NcRecordFile } from './ncRecordFile';

/**
 * The files `stria run` writes as it goes: gridded snapshots every `every` steps (counted from the
 * model's step 0, so a resumed run keeps the same cadence) and the zonal-mean time series at every
 * sample of the run monitor. Both are NetCDF (CF) files growing record by record (NcRecordFile).
 */
export interface RunOutputRequest {
  snapshots?: string;
  every?: number;
  zonal?: string;
}

export class RunOutputs {
  private readonly snapshots: NcRecordFile | null;
  private readonly zonal: NcRecordFile | null;
  private readonly every: number;
  private readonly plan: SnapshotPlan | null;
  private fields: GridFields | undefined;

  constructor(model: Model, req: RunOutputRequest, run: StriaRunInfo) {
    this.every = req.every ?? 0;
    this.snapshots = req.snapshots ? new NcRecordFile(req.snapshots, SNAPSHOT_FILE, run) : null;
    this.zonal = req.zonal ? new NcRecordFile(req.zonal, ZONAL_MEAN_FILE, run) : null;
    this.plan = this.snapshots ? new SnapshotPlan(model.params) : null;
  }

  hooks(): RunHooks {
    return {
      onStep: (m) => {
        if (!this.snapshots || m.steps % this.every !== 0) return;
        this.fields = this.plan!.gridFields(m.qHat, this.fields);
        this.snapshots.append(snapshotFrame(m.time, m.steps, this.fields));
      },
      onSample: (t, steps, z) => this.zonal?.append(zonalMeanFrame(t, steps, z)),
    };
  }

  /** "12 snapshots to run.nc, 250 zonal-mean records to zonal.nc", or '' when nothing is written. */
  describe(): string {
    return [this.snapshots, this.zonal]
      .filter((f): f is NcRecordFile => f !== null)
      .map((f) => `${f.records} ${f === this.snapshots ? 'snapshot' : 'zonal-mean'} record${f.records === 1 ? '' : 's'} in ${f.path}`)
      .join(', ');
  }

  close(): void {
    this.snapshots?.close();
    this.zonal?.close();
  }
}
