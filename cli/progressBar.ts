/**
 * A one-line progress bar on a terminal: redrawn in place (carriage return), at most ten times a
 * second, and erased when done. Commands make one only when standard error is a TTY, so logs and
 * pipes get no control characters.
 */
export class ProgressBar {
  private last = 0;
  private readonly started = Date.now();

  constructor(
    private readonly stream: NodeJS.WriteStream,
    private readonly label: string,
  ) {}

  /** Show `fraction` done (0..1) with a status text; redraws only every 100 ms. */
  update(fraction: number, status: string): void {
    const now = Date.now();
    if (now - this.last < 100) return;
    this.last = now;
    const elapsed = (now - this.started) / 1000;
    const eta = fraction > 0 && fraction < 1 ? (elapsed * (1 - fraction)) / fraction : NaN;
    const width = Math.max(20, (this.stream.columns ?? 80) - 1);
    // Clear to the end of the line: a shorter status must not leave the tail of the longer one.
    this.stream.write(`\r${renderProgress(this.label, fraction, status, eta, width)}\x1b[K`);
  }

  /** Erase the bar. */
  done(): void {
    this.stream.write('\r\x1b[2K');
  }
}

/** The bar's text, fitted to `width` columns: label, bar, percentage, status, time left. */
export function renderProgress(
  label: string,
  fraction: number,
  status: string,
  etaSeconds: number,
  width: number,
): string {
  const f = Math.min(1, Math.max(0, Number.isFinite(fraction) ? fraction : 0));
  const tail = ` ${(100 * f).toFixed(0).padStart(3)}% ${status}${Number.isFinite(etaSeconds) ? `, ${formatSeconds(etaSeconds)} left` : ''}`;
  const barWidth = Math.max(10, Math.min(40, width - label.length - tail.length - 3));
  const full = Math.round(f * barWidth);
  const line = `${label} [${'#'.repeat(full)}${'-'.repeat(barWidth - full)}]${tail}`;
  return line.length > width ? line.slice(0, width) : line;
}

export function formatSeconds(s: number): string {
  if (s < 60) return `${s.toFixed(0)} s`;
  if (s < 3600) return `${Math.floor(s / 60)} min ${Math.round(s % 60)} s`;
  return `${Math.floor(s / 3600)} h ${Math.round((s % 3600) / 60)} min`;
}
