import { wrap, type Remote } from 'comlink';
import type { SimulationApi } from '../../workers/simulationApi';
import { Watchdog } from './watchdog';

/** Heartbeat period (ms): one ping in flight at most, so a busy worker gets one, not a queue of them. */
export const HEARTBEAT_MS = 1000;

/** What a call to a dead worker rejects with: the client resumes the run elsewhere, so this is not the caller's failure. */
export class WorkerStoppedError extends Error {
  constructor(reason: string) {
    super(`the simulation worker stopped (${reason})`);
    this.name = 'WorkerStoppedError';
  }
}

/**
 * One simulation worker and the means to notice its death: its error event, or a silence the
 * watchdog (watchdog.ts) will not excuse. On death every call still waiting rejects with a
 * WorkerStoppedError (comlink's would otherwise wait for ever), the worker is terminated (it may be
 * hung rather than gone) and `onDeath` is told once.
 */
export class WorkerLink {
  readonly api: Remote<SimulationApi>;
  private readonly worker: Worker;
  private readonly watchdog = new Watchdog(performance.now());
  private readonly waiting = new Set<(e: Error) => void>();
  private readonly timer: ReturnType<typeof setInterval>;
  private busy = 0;
  private pinging = false;
  private over = false;
  /** Whether the worker has answered once: its script may take a while to load, and a load that fails fires `error`. */
  private answered = false;

  constructor(private readonly onDeath: (reason: string) => void) {
    this.worker = new Worker(new URL('../../workers/simulation.worker.ts', import.meta.url), { type: 'module' });
    this.api = wrap<SimulationApi>(this.worker);
    this.worker.addEventListener('error', (e) => this.die(e.message || 'it failed to start or threw outside a call'));
    this.timer = setInterval(() => this.beat(), HEARTBEAT_MS);
  }

  get alive(): boolean {
    return !this.over;
  }

  /**
   * Make a call; `long` marks one that may keep the worker busy for a while (a new model, an export),
   * during which the watchdog waits longer. Rejects with WorkerStoppedError if the worker dies first.
   */
  call<T>(run: (api: Remote<SimulationApi>) => Promise<T>, long = false): Promise<T> {
    if (this.over) return Promise.reject(new WorkerStoppedError('it was already stopped'));
    if (long) this.busy++;
    return new Promise<T>((resolve, reject) => {
      this.waiting.add(reject);
      const settle = (): void => {
        this.waiting.delete(reject);
        if (long) this.busy--;
        if (this.over) return;
        this.answered = true;
        this.watchdog.heard(performance.now());
      };
      run(this.api).then(
        (v) => (settle(), resolve(v)),
        (e: unknown) => (settle(), reject(e)),
      );
    });
  }

  /** For the tests of recovery only: end the worker the way a crash would, without telling anyone. */
  kill(): void {
    this.worker.terminate();
  }

  /** An orderly end: release the model, then end the worker. No death is reported. */
  close(): void {
    if (this.over) return;
    this.over = true;
    clearInterval(this.timer);
    const api = this.api;
    const worker = this.worker;
    const done = (): void => worker.terminate();
    // A worker that no longer answers is ended anyway after a short wait.
    const late = setTimeout(done, 2000);
    api.dispose().then(
      () => (clearTimeout(late), done()),
      () => (clearTimeout(late), done()),
    );
    this.rejectAll(new WorkerStoppedError('the run was closed'));
  }

  private beat(): void {
    if (this.over) return;
    if (!this.pinging) {
      this.pinging = true;
      this.call((api) => api.ping()).then(
        () => (this.pinging = false),
        () => (this.pinging = false),
      );
    }
    if (this.answered && this.watchdog.tick(performance.now(), this.busy > 0)) this.die('it stopped answering');
  }

  private die(reason: string): void {
    if (this.over) return;
    this.over = true;
    clearInterval(this.timer);
    this.worker.terminate();
    this.rejectAll(new WorkerStoppedError(reason));
    this.onDeath(reason);
  }

  private rejectAll(e: Error): void {
    const waiting = [...this.waiting];
    this.waiting.clear();
    for (const reject of waiting) reject(e);
  }
}
