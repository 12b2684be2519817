import { transfer, wrap } from 'comlink';
import type { FileAnalysis } from '../../lib/userfile/analyzeFile';
import type { UserDataApi, UserFileOptions } from '../../workers/userData.worker';
import { APP_RUNTIME_BYTES, appMemoryBudget, type MemoryBudget } from '../appMemory';
import { importRefusal } from '../share/importLimits';

/** Analyse a user's file in a worker of its own, ended when done; rejects with the reason the file was refused, naming it. */
export async function analyzeUserFile(
  file: File,
  options: UserFileOptions,
  budget: MemoryBudget = appMemoryBudget(),
): Promise<FileAnalysis> {
  const tooLarge = importRefusal('userData', file);
  if (tooLarge) throw new RangeError(tooLarge);
  const bytes = await file.arrayBuffer();
  const worker = new Worker(new URL('../../workers/userData.worker.ts', import.meta.url), { type: 'module' });
  // The page's budget (the one a run gets), estimated from the file's dimensions before a value is read.
  const withBudget = { ...options, memoryBudget: budget.bytes, runtimeBytes: APP_RUNTIME_BYTES };
  try {
    return await wrap<UserDataApi>(worker).analyze(transfer(bytes, [bytes]), withBudget);
  } catch (e) {
    throw new RangeError(`${file.name}: ${e instanceof Error ? e.message : String(e)}`, { cause: e });
  } finally {
    worker.terminate();
  }
}
