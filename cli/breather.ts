/**
 * Lets a long synchronous computation hear the outside world: stepping the model never returns to
 * Node's event loop by itself, so signal handlers (Ctrl-C) and stream writes would wait for the end
 * of the run. `breathe()` yields one turn of the loop when `intervalMs` have passed since the last
 * one, which costs nothing measurable at the default 50 ms.
 */
export class Breather {
  private last = Date.now();

  constructor(private readonly intervalMs = 50) {}

  async breathe(): Promise<void> {
    const now = Date.now();
    if (now - this.last < this.intervalMs) return;
    this.last = now;
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
}
