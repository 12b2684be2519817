import type { Model } from '../lib/model/model';
import { MAX_THREADS, SMALL_GRID_POINTS } from '../lib/model/stepTeam';
import { canShareMemory, startWebStepThreads, type WebStepThreads } from './webStepThreads';

/** The threads the app's step runs on, as the simulation worker reports them. */
export interface ThreadsInfo {
  /** Threads asked for, the simulation worker included. */
  asked: number;
  /** Threads the step runs on now (1 when the helpers could not start or memory cannot be shared). */
  running: number;
  /** Why it runs on fewer than asked, in words, or null. */
  note: string | null;
}

/**
 * The simulation worker's choice of threads: the helper workers for the count asked for, and the
 * model put on them. The bits do not depend on the count (docs/threads.md), so a change takes
 * effect between two steps and the run goes on as it was.
 */
function small(model: Model): boolean {
  return model.params.nx * model.params.ny < SMALL_GRID_POINTS;
}

export class ThreadChoice {
  private asked = 1;
  private helpers: WebStepThreads | null = null;
  private note: string | null = null;
  /** Whether helpers are being started (the step runs on one thread meanwhile). */
  private starting = false;
  /** The change under way: changes run one after another. */
  private settled: Promise<unknown> = Promise.resolve();

  /**
   * Start the helpers for `count` threads (ending those before) and put the model `current()` returns
   * then on them; says how it went. The helpers take a while to start and other messages are served
   * meanwhile, so the model is looked up when they are ready, not when asked.
   */
  set(count: number, current: () => Model | null): Promise<ThreadsInfo> {
    if (!(Number.isInteger(count) && count >= 1 && count <= MAX_THREADS))
      return Promise.reject(new RangeError(`threads: a whole number from 1 to ${MAX_THREADS}, got ${count}`));
    const next = this.settled.then(() => this.change(count, current));
    this.settled = next.catch(() => undefined);
    return next;
  }

  private async change(count: number, current: () => Model | null): Promise<ThreadsInfo> {
    this.asked = count;
    if (count === (this.helpers?.threads.count ?? 1) && !this.helpers?.threads.failed) return this.apply(current());
    current()?.useThreads(null);
    this.helpers?.close();
    this.helpers = null;
    this.note = null;
    if (count > 1) {
      if (!canShareMemory())
        this.note = 'the page is not cross-origin isolated, so it cannot share memory between threads';
      else {
        this.starting = true;
        try {
          this.helpers = await startWebStepThreads(count);
        } catch (e) {
          this.note = `the helper threads could not start (${e instanceof Error ? e.message : String(e)})`;
        } finally {
          this.starting = false;
        }
      }
    }
    return this.apply(current());
  }

  /** Put `model` (a new run, or the present one) on the chosen threads; a failure leaves it on one. */
  apply(model: Model | null): ThreadsInfo {
    if (model && small(model)) model.useThreads(null);
    else if (model && this.helpers) {
      try {
        model.useThreads(this.helpers.threads);
      } catch (e) {
        this.note = `the helper threads failed (${e instanceof Error ? e.message : String(e)})`;
        this.helpers.close();
        this.helpers = null;
      }
    }
    return this.info(model);
  }

  /** A step met a failure of the helpers (ThreadTeamError): say so; the model goes on alone. */
  failed(reason: string): void {
    const said = this.helpers?.lastError();
    this.note = `the helper threads failed: ${reason}${said ? ` (${said})` : ''}`;
  }

  info(model: Model | null): ThreadsInfo {
    const running = model?.threadCount ?? this.helpers?.threads.count ?? 1;
    if (running >= this.asked) return { asked: this.asked, running, note: null };
    const said = this.helpers?.lastError();
    const note =
      this.note ??
      (model && small(model)
        ? `grids below ${Math.sqrt(SMALL_GRID_POINTS)}² step on one, their passes being shorter than it takes threads to meet`
        : this.starting
          ? 'the helper threads are starting'
          : `the helper threads failed${said ? ` (${said})` : ''}`);
    return { asked: this.asked, running, note };
  }

  close(): void {
    this.helpers?.close();
    this.helpers = null;
  }
}
