/**
 * Steps per second of wall-clock time, over a sliding window of about one second, so the readout is
 * steady while playing and drops to zero soon after a pause.
 */
export class RateMeter {
  private readonly times: number[] = [];
  private readonly steps: number[] = [];

  constructor(private readonly windowMs = 1000) {}

  /** Record that the run stood at `steps` at wall time `nowMs`; returns the current rate (steps/s). */
  sample(steps: number, nowMs: number): number {
    const { times, steps: counts } = this;
    // A step count that went backwards is a new run: its rate starts afresh.
    if (counts.length && steps < counts[counts.length - 1]) this.reset();
    times.push(nowMs);
    counts.push(steps);
    while (times.length > 2 && nowMs - times[1] >= this.windowMs) {
      times.shift();
      counts.shift();
    }
    return this.rate(nowMs);
  }

  /** The rate as of `nowMs`: zero once no step has been recorded for a whole window. */
  rate(nowMs: number): number {
    const n = this.times.length;
    if (n < 2 || nowMs - this.times[n - 1] >= this.windowMs) return 0;
    const span = this.times[n - 1] - this.times[0];
    return span > 0 ? ((this.steps[n - 1] - this.steps[0]) * 1000) / span : 0;
  }

  reset(): void {
    this.times.length = 0;
    this.steps.length = 0;
  }
}
