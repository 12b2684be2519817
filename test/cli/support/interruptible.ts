import { Writable } from 'node:stream';
import type { Result } from './stria';

/**
 * `stria` in this process with Ctrl-C arriving on the n-th look at the interrupt flag (a run looks
 * once per chunk of at most 25 steps): an interruption at a known point, the same every time.
 */
export async function striaInterrupted(args: readonly string[], afterLooks: number): Promise<Result> {
  const { main } = await import('../../../cli/main');
  let stdout = '';
  let stderr = '';
  let looks = 0;
  const sink = (add: (s: string) => void) => new Writable({ write: (chunk, _enc, cb) => (add(String(chunk)), cb()) });
  const status = await main(args, {
    out: sink((s) => (stdout += s)),
    err: sink((s) => (stderr += s)),
    argv: args,
    interrupted: () => ++looks >= afterLooks,
  });
  return { status, stdout, stderr };
}
