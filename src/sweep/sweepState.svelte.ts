import type { SweepFits } from '../../lib/sweep/sweepFits';
import { sweepFits } from '../../lib/sweep/sweepFits';
import type { SweepRecord } from '../../lib/sweep/sweepRecord';
import type { SweepJob } from '../../lib/sweep/sweepRuns';
import { tableRows, type TableRow } from '../../lib/sweep/sweepTable';
import type { ScalingFitOptions } from '../../lib/analysis/scalingFit';
import { RHINES_EXAMPLE } from '../../lib/sweep/rhinesExample';
import { SweepPool } from './browserPool';

/**
 * The sweep the editor opens with: the one that shows the Rhines scaling (lib/sweep/rhinesExample.ts,
 * the README's and `npm run bench -- --scaling-law`'s): five β from 10 to 160 at 128², each to t = 250,
 * whose fitted exponent of jet spacing against the Rhines length has an interval holding 1 and not 0.
 */
export const STARTER_SPEC = `${JSON.stringify(
  { ...RHINES_EXAMPLE, title: 'Jet spacing against the Rhines length: five beta from 10 to 160 at 128 x 128' },
  null,
  2,
)}\n`;

/**
 * The Sweep view's state, kept while the view is closed (a sweep goes on in its workers meanwhile):
 * the spec text, the run in progress, and the results shown, whether run here or loaded from a file.
 */
class SweepState {
  specText = $state(STARTER_SPEC);
  jobs = $state.raw<SweepJob[]>([]);
  running = $state.raw<string[]>([]);
  records = $state.raw<SweepRecord[]>([]);
  /** Rows and fits of the results shown, and where they came from. */
  rows = $state.raw<TableRow[]>([]);
  fits = $state.raw<SweepFits | null>(null);
  source = $state<string | null>(null);
  busy = $state(false);
  message = $state<{ text: string; bad: boolean } | null>(null);
  private pool: SweepPool | null = null;

  show(rows: TableRow[], source: string, options: ScalingFitOptions): void {
    this.rows = rows;
    this.fits = rows.length ? sweepFits(rows, options) : null;
    this.source = source;
  }

  async run(jobs: SweepJob[], size: number, options: ScalingFitOptions, title: string): Promise<void> {
    this.jobs = jobs;
    this.records = [];
    this.running = [];
    this.busy = true;
    this.message = null;
    this.show([], title, options);
    const pool = (this.pool = new SweepPool());
    try {
      const { cancelled } = await pool.run(jobs, size, {
        started: (job) => (this.running = [...this.running, job.id]),
        finished: (record) => {
          this.running = this.running.filter((id) => id !== record.id);
          this.records = [...this.records, record].sort((a, b) => a.index - b.index);
          this.show(tableRows(this.records), title, options);
        },
      });
      this.message = cancelled
        ? { text: `Stopped after ${this.records.length} of ${jobs.length} runs.`, bad: false }
        : { text: `Finished ${jobs.length} runs.`, bad: false };
    } catch (e) {
      this.message = { text: `The sweep failed: ${e instanceof Error ? e.message : String(e)}`, bad: true };
    } finally {
      this.busy = false;
      this.running = [];
      this.pool = null;
    }
  }

  cancel(): void {
    this.pool?.cancel();
  }
}

export const sweepState = new SweepState();
