import { Worker } from 'node:worker_threads';

/**
 * Run a boundary's property (a module exporting `boundary`, test/reliability/boundaries/) in a
 * worker thread with a per-case time limit: the worker announces each case, and a case that has
 * not finished within `caseLimitMs` ends the worker and fails the test, naming the input.
 */
export interface BoundaryResult {
  numRuns: number;
  failed: boolean;
  counterexample: string | null;
  error: string | null;
  hung: string | null;
  tally: Record<string, number>;
  seconds: number;
}

/** At most this many boundary workers at once: one per core of a two-core machine. */
const MAX_WORKERS = 2;
let running = 0;
const waiting: (() => void)[] = [];

export async function runBoundary(
  moduleUrl: URL,
  numRuns: number,
  seed: number,
  caseLimitMs: number,
): Promise<BoundaryResult> {
  if (running >= MAX_WORKERS) await new Promise<void>((resolve) => waiting.push(resolve));
  running++;
  try {
    return await runInWorker(moduleUrl, numRuns, seed, caseLimitMs);
  } finally {
    running--;
    waiting.shift()?.();
  }
}

function runInWorker(moduleUrl: URL, numRuns: number, seed: number, caseLimitMs: number): Promise<BoundaryResult> {
  const started = Date.now();
  return new Promise((resolve, reject) => {
    const worker = new Worker(new URL('./propertyWorker.js', import.meta.url), {
      workerData: { module: moduleUrl.href, numRuns, seed },
    });
    let current: { index: number; preview: string; at: number } | null = null;
    let finished = false;
    const watchdog = setInterval(() => {
      if (current && Date.now() - current.at > caseLimitMs) {
        finished = true;
        clearInterval(watchdog);
        const c = current;
        void worker.terminate().then(() =>
          resolve({
            numRuns: c.index,
            failed: true,
            counterexample: c.preview,
            error: null,
            hung: `case ${c.index} ran over ${caseLimitMs} ms: ${c.preview}`,
            tally: {},
            seconds: (Date.now() - started) / 1000,
          }),
        );
      }
    }, 50);
    worker.on(
      'message',
      (m: { kind: string; index: number; preview: string } & Omit<BoundaryResult, 'hung' | 'seconds'>) => {
        if (m.kind === 'case') current = { index: m.index, preview: m.preview, at: Date.now() };
        else if (m.kind === 'done') {
          finished = true;
          clearInterval(watchdog);
          void worker.terminate();
          resolve({
            numRuns: m.numRuns,
            failed: m.failed,
            counterexample: m.counterexample,
            error: m.error,
            hung: null,
            tally: m.tally,
            seconds: (Date.now() - started) / 1000,
          });
        }
      },
    );
    worker.on('error', (e) => {
      clearInterval(watchdog);
      if (!finished) reject(e);
    });
    worker.on('exit', (code) => {
      clearInterval(watchdog);
      if (!finished) reject(new Error(`property worker exited with code ${code} before finishing`));
    });
  });
}
