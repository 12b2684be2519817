/**
 * When to take a silent worker for dead. A terminated or crashed worker (out of memory, say) does not
 * always fire an error event: its messages simply stop and every call to it waits for ever. So the
 * UI pings it once a tick (workerLink.ts) and counts the silence. The simulation worker answers
 * between slices of play (12 ms plus one step), so seconds of silence mean it is gone, unless a long
 * call is in flight (a new large grid, an export), when it may be busy for much longer.
 *
 * Silence is counted in ticks as well as in time: a main thread frozen for seconds (a large file
 * read) runs one late tick before it reads the answers that queued meanwhile, and that tick alone
 * must not condemn the worker.
 */
export interface WatchdogLimits {
  /** Silence (ms) after which an idle or playing worker is taken for dead. */
  quietMs: number;
  /** The same while a long call is in flight. */
  busyQuietMs: number;
  /** Ticks in a row without an answer needed as well. */
  minTicks: number;
}

export const WATCHDOG_LIMITS: Readonly<WatchdogLimits> = Object.freeze({
  quietMs: 6000,
  busyQuietMs: 120_000,
  minTicks: 3,
});

export class Watchdog {
  private lastHeard: number;
  private silentTicks = 0;

  constructor(
    now: number,
    private readonly limits: WatchdogLimits = WATCHDOG_LIMITS,
  ) {
    this.lastHeard = now;
  }

  /** The worker answered something (a ping, a snapshot, any call). */
  heard(now: number): void {
    this.lastHeard = Math.max(this.lastHeard, now);
    this.silentTicks = 0;
  }

  /** One tick of the heartbeat; true when the worker is to be taken for dead. */
  tick(now: number, busy: boolean): boolean {
    this.silentTicks++;
    const limit = busy ? this.limits.busyQuietMs : this.limits.quietMs;
    return this.silentTicks >= this.limits.minTicks && now - this.lastHeard > limit;
  }
}
