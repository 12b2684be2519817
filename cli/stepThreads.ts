import { Worker } from 'node:worker_threads';
import { StepThreads } from '../lib/model/threadTeam';

/** Helper threads for a model's step on the command line (Node worker_threads). */
export interface NodeStepThreads {
  /** What the Model takes (lib/model/threadTeam.ts); `count` threads, the calling one included. */
  readonly threads: StepThreads;
  /** Stop the helper threads. */
  close(): Promise<void>;
}

/**
 * Start `count − 1` helper threads and wait until each has loaded; `count` = 1 starts none. The
 * threads do not keep the process alive, and a failure of one is seen by the step that meets it
 * (it throws ThreadTeamError and the model goes on with one thread), not here.
 */
export async function startStepThreads(count: number): Promise<NodeStepThreads> {
  const workers: Worker[] = [];
  const ready: Promise<void>[] = [];
  for (let i = 0; i < count - 1; i++) {
    const w = new Worker(new URL('./stepThread.js', import.meta.url));
    w.unref();
    workers.push(w);
    ready.push(
      new Promise<void>((resolve, reject) => {
        w.once('message', () => resolve());
        w.once('error', reject);
        w.once('exit', (code) => reject(new Error(`a step thread exited while starting (code ${code})`)));
      }),
    );
    // Later failures reach the step through the team's control block; keep them from ending the process.
    w.on('error', () => {});
  }
  try {
    await Promise.all(ready);
  } catch (e) {
    await Promise.all(workers.map((w) => w.terminate()));
    throw e;
  }
  return {
    threads: new StepThreads(workers.length, (i, message) => workers[i].postMessage(message)),
    close: async () => {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}
