import { SnapshotPlan, type GridFields } from '../lib/analysis/snapshot';
import type { StriaRunInfo } from '../lib/io/cfGlobalAttributes';
import { SNAPSHOT_FILE, ZONAL_MEAN_FILE } from '../lib/io/cfStria';
import { snapshotFrame, zonalMeanFrame } from '../lib/io/cfStriaWriter';
import type { ModelParams } from '../lib/model/params';
import { monitoredParams, monitoredState, type RunHooks } from '../lib/run/monitoredRun';
import type { OutputProgress } from '../lib/run/runProgress';
import { NcRecordFile } from './ncRecordFile';

/**
 * The files `stria run` writes as it goes: gridded snapshots every `every` steps (counted from the
 * model's step 0, so a resumed run keeps the same cadence) and the zonal-mean time series at every
 * sample of the run monitor. Both are NetCDF (CF) files growing record by record (NcRecordFile).
 * A resumed run continues them from the record counts its checkpoint holds (`keep`), and a blow-up
 * retry rolls them back to those of its checkpoint.
 */
export interface RunOutputRequest {
  snapshots?: string;
  every?: number;
  zonal?: string;
}

/** Records in each file (null: the file is not written). */
export interface OutputCounts {
  snapshots: number | null;
  zonal: number | null;
}

export class RunOutputs {
  private readonly snapshots: NcRecordFile | null;
  private readonly zonal: NcRecordFile | null;
  private readonly every: number;
  private readonly plan: SnapshotPlan | null;
  private readonly run: StriaRunInfo;
  private fields: GridFields | undefined;
  /** Two layers: the barotropic spectrum the snapshots show (monitoredState). */
  private barotropic: Float64Array | undefined;

  constructor(params: ModelParams, req: RunOutputRequest, run: StriaRunInfo, keep: Partial<OutputCounts> = {}) {
    this.every = req.every ?? 0;
    this.run = run;
    const open = (path: string, kind: typeof SNAPSHOT_FILE, n: number | null | undefined) =>
      typeof n === 'number' ? NcRecordFile.continue(path, kind, run, n) : new NcRecordFile(path, kind, run);
    this.snapshots = req.snapshots ? open(req.snapshots, SNAPSHOT_FILE, keep.snapshots) : null;
    try {
      this.zonal = req.zonal ? open(req.zonal, ZONAL_MEAN_FILE, keep.zonal) : null;
    } catch (e) {
      this.snapshots?.close();
      throw e;
    }
    // Two layers: the snapshots hold the barotropic flow, as the summary and zonal means do (monitoredParams).
    this.plan = this.snapshots ? new SnapshotPlan(monitoredParams(params)) : null;
  }

  hooks(): RunHooks {
    return {
      onStep: (m) => {
        if (!this.snapshots || m.steps % this.every !== 0) return;
        const q = monitoredState(m, this.barotropic);
        if (q !== m.qHat) this.barotropic = q;
        this.fields = this.plan!.gridFields(q, this.fields);
        this.snapshots.append(snapshotFrame(m.time, m.steps, this.fields));
      },
      onSample: (t, steps, z) => this.zonal?.append(zonalMeanFrame(t, steps, z)),
    };
  }

  counts(): OutputCounts {
    return { snapshots: this.snapshots?.records ?? null, zonal: this.zonal?.records ?? null };
  }

  /** The files as a checkpoint's progress records them. */
  progress(): Pick<OutputProgress, 'snapshots' | 'zonal'> {
    return {
      snapshots: this.snapshots
        ? { path: this.snapshots.path, every: this.every, records: this.snapshots.records }
        : null,
      zonal: this.zonal ? { path: this.zonal.path, records: this.zonal.records } : null,
    };
  }

  /** Drop the records written after `counts` were taken. */
  rollBack(counts: OutputCounts): void {
    if (this.snapshots && counts.snapshots !== null) this.snapshots.rollBack(counts.snapshots, SNAPSHOT_FILE, this.run);
    if (this.zonal && counts.zonal !== null) this.zonal.rollBack(counts.zonal, ZONAL_MEAN_FILE, this.run);
  }

  /** Flush both files to the disk. */
  sync(): void {
    this.snapshots?.sync();
    this.zonal?.sync();
  }

  /** "12 snapshots to run.nc, 250 zonal-mean records to zonal.nc", or '' when nothing is written. */
  describe(): string {
    return [this.snapshots, this.zonal]
      .filter((f): f is NcRecordFile => f !== null)
      .map(
        (f) =>
          `${f.records} ${f === this.snapshots ? 'snapshot' : 'zonal-mean'} record${f.records === 1 ? '' : 's'} in ${f.path}`,
      )
      .join(', ');
  }

  close(): void {
    this.snapshots?.close();
    this.zonal?.close();
  }
}
