import { formatSeconds } from './progressBar';

/** Seconds between progress lines when standard error is not a terminal. */
export const DEFAULT_PROGRESS_SECONDS = 5;

/**
 * Progress as whole lines, for a standard error that is a log or a pipe (a batch job's output):
 * one line at most every `seconds`, with the percentage, a status and the time left, so the log
 * shows the run moving without a carriage return or an escape code in it.
 */
export class ProgressLines {
  private last: number;
  private readonly started = Date.now();

  constructor(
    private readonly stream: NodeJS.WritableStream,
    private readonly label: string,
    private readonly seconds: number = DEFAULT_PROGRESS_SECONDS,
  ) {
    this.last = this.started;
  }

  /** Write a line for `fraction` done (0..1) when `seconds` have passed since the last one. */
  update(fraction: number, status: string): void {
    const now = Date.now();
    if (now - this.last < 1000 * this.seconds) return;
    this.last = now;
    const elapsed = (now - this.started) / 1000;
    const f = Math.min(1, Math.max(0, fraction));
    const eta = f > 0 && f < 1 ? (elapsed * (1 - f)) / f : NaN;
    this.stream.write(
      `${this.label}: ${(100 * f).toFixed(0)}% ${status}${Number.isFinite(eta) ? `, about ${formatSeconds(eta)} left` : ''}\n`,
    );
  }
}
