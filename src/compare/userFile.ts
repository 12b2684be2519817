import { transfer, wrap } from 'comlink';
import type { FileAnalysis } from '../../lib/userfile/analyzeFile';
import type { UserDataApi, UserFileOptions } from '../../workers/userData.worker';
import { importRefusal } from '../share/importLimits';

/** Analyse a user's file in a worker of its own, ended when done; rejects with the reason the file was refused, naming it. */
export async function analyzeUserFile(file: File, options: UserFileOptions): Promise<FileAnalysis> {
  const tooLarge = importRefusal('userData', file);
  if (tooLarge) throw new RangeError(tooLarge);
  const bytes = await file.arrayBuffer();
  const worker = new Worker(new URL('../../workers/userData.worker.ts', import.meta.url), { type: 'module' });
  try {
    return await wrap<UserDataApi>(worker).analyze(transfer(bytes, [bytes]), options);
  } catch (e) {
    throw new RangeError(`${file.name}: ${e instanceof Error ? e.message : String(e)}`, { cause: e });
  } finally {
    worker.terminate();
  }
}
