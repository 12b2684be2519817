import { StepThreads } from '../lib/model/threadTeam';

/** Helper threads of the app's step: web workers started by the simulation worker. */
export interface WebStepThreads {
  /** What the Model takes (lib/model/threadTeam.ts): `count` threads, the simulation worker included. */
  readonly threads: StepThreads;
  /** End the helper workers. */
  close(): void;
  /** What the last helper that failed said, or null. */
  lastError(): string | null;
}

/**
 * Whether this worker may share memory with others: SharedArrayBuffer exists only in a
 * cross-origin isolated page (the page was served with Cross-Origin-Opener-Policy: same-origin and
 * Cross-Origin-Embedder-Policy: require-corp, and its workers inherit the isolation).
 */
export function canShareMemory(): boolean {
  return globalThis.crossOriginIsolated === true && typeof SharedArrayBuffer === 'function';
}

/**
 * Start `count − 1` helper web workers and wait until each has loaded (rejects, ending them all,
 * when one cannot). A helper that fails later is met by the step (ThreadTeamError), not here.
 */
export async function startWebStepThreads(count: number): Promise<WebStepThreads> {
  const workers: Worker[] = [];
  let lastError: string | null = null;
  const ready: Promise<void>[] = [];
  for (let i = 0; i < count - 1; i++) {
    const w = new Worker(new URL('./stepHelper.worker.ts', import.meta.url), { type: 'module' });
    workers.push(w);
    w.addEventListener('error', (e) => (lastError = e.message || 'a step helper failed'));
    ready.push(
      new Promise<void>((resolve, reject) => {
        w.addEventListener('message', () => resolve(), { once: true });
        w.addEventListener('error', (e) => reject(new Error(e.message || 'a step helper failed to start')), {
          once: true,
        });
      }),
    );
  }
  const close = () => workers.forEach((w) => w.terminate());
  try {
    await Promise.all(ready);
  } catch (e) {
    close();
    throw e;
  }
  return {
    // The invitations leave only when this worker returns to its event loop: join must not block on them.
    threads: new StepThreads(workers.length, (i, message) => workers[i].postMessage(message), false),
    close,
    lastError: () => lastError,
  };
}
