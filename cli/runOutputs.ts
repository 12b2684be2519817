import { LayerSnapshotPlan } from '../lib/analysis/layerSnapshot';
import { SnapshotPlan, type GridFields } from '../lib/analysis/snapshot';
import type { StriaRunInfo } from '../lib/io/cfGlobalAttributes';
import { fileKindsOf, type StriaFileKindSpec } from '../lib/io/cfStria';
import { layerSnapshotFrame, layerZonalMeanFrame, snapshotFrame, zonalMeanFrame } from '../lib/io/cfStriaWriter';
import type { ModelParams } from '../lib/model/params';
import type { RunHooks } from '../lib/run/monitoredRun';
import type { OutputProgress } from '../lib/run/runProgress';
import { NcRecordFile } from './ncRecordFile';

/**
 * The files `stria run` writes as it goes: gridded snapshots every `every` steps (counted from the
 * model's step 0, so a resumed run keeps the same cadence) and the zonal-mean time series at every
 * sample of the run monitor. Both are NetCDF (CF) files growing record by record (NcRecordFile).
 * A resumed run continues them from the record counts its checkpoint holds (`keep`), and a blow-up
 * retry rolls them back to those of its checkpoint. A two-layer run writes both layers, with a layer
 * dimension (lib/io/cfStria.ts, docs/file-formats.md), and its zonal means carry the heat flux.
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
  private readonly layerPlan: LayerSnapshotPlan | null;
  private readonly run: StriaRunInfo;
  private readonly kinds: { snapshots: StriaFileKindSpec; zonal: StriaFileKindSpec };
  private fields: GridFields | undefined;
  private lower: GridFields | undefined;

  constructor(params: ModelParams, req: RunOutputRequest, run: StriaRunInfo, keep: Partial<OutputCounts> = {}) {
    this.every = req.every ?? 0;
    this.run = run;
    this.kinds = fileKindsOf(params.layers);
    const open = (path: string, kind: StriaFileKindSpec, n: number | null | undefined) =>
      typeof n === 'number' ? NcRecordFile.continue(path, kind, run, n) : new NcRecordFile(path, kind, run);
    this.snapshots = req.snapshots ? open(req.snapshots, this.kinds.snapshots, keep.snapshots) : null;
    try {
      this.zonal = req.zonal ? open(req.zonal, this.kinds.zonal, keep.zonal) : null;
    } catch (e) {
      this.snapshots?.close();
      throw e;
    }
    const two = params.layers === 2;
    this.plan = this.snapshots && !two ? new SnapshotPlan(params) : null;
    this.layerPlan = this.snapshots && two ? new LayerSnapshotPlan(params) : null;
  }

  hooks(): RunHooks {
    return {
      onStep: (m) => {
        if (!this.snapshots || m.steps % this.every !== 0) return;
        if (this.layerPlan) {
          this.fields = this.layerPlan.gridFields(m.qHat, 'upper', this.fields);
          this.lower = this.layerPlan.gridFields(m.qHat, 'lower', this.lower);
          this.snapshots.append(layerSnapshotFrame(m.time, m.steps, this.fields, this.lower));
          return;
        }
        this.fields = this.plan!.gridFields(m.qHat, this.fields);
        this.snapshots.append(snapshotFrame(m.time, m.steps, this.fields));
      },
      onSample: (t, steps, z, layers) =>
        this.zonal?.append(layers ? layerZonalMeanFrame(t, steps, layers) : zonalMeanFrame(t, steps, z)),
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
    if (this.snapshots && counts.snapshots !== null)
      this.snapshots.rollBack(counts.snapshots, this.kinds.snapshots, this.run);
    if (this.zonal && counts.zonal !== null) this.zonal.rollBack(counts.zonal, this.kinds.zonal, this.run);
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
