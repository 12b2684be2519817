import type { ModelParams } from '../lib/model/params';
import { canonicalJson, runId } from '../lib/run/runId';
import type { RunPlan } from '../lib/run/runPlan';
import type { RunProgress } from '../lib/run/runProgress';
import { UsageError } from './args';

/**
 * `--resume FILE` continues the run that wrote FILE, so the command must describe that run: the same
 * parameters (as asked, before any retry halved the step) and the same run plan, i.e. the same run
 * id. A command that differs is refused, naming the first thing that differs, rather than quietly
 * continuing a different experiment from someone else's state.
 */
export function checkSameRun(path: string, params: ModelParams, plan: RunPlan, progress: RunProgress): void {
  if (runId(params, plan) === progress.id) return;
  const theirs = progress.params as unknown as Record<string, unknown>;
  const ours = params as unknown as Record<string, unknown>;
  const key = Object.keys(ours).find((k) => canonicalJson(ours[k]) !== canonicalJson(theirs[k]));
  const what = key
    ? `${key} = ${canonicalJson(ours[key])} here, ${canonicalJson(theirs[key])} in the checkpoint`
    : `the run plan differs: here ${canonicalJson(plan)}, in the checkpoint ${canonicalJson(progress.plan)}`;
  throw new UsageError(
    `--resume ${path}: the checkpoint is of another run (${what}); resume with the command that wrote it, or continue its state with stria run ${path}`,
  );
}
