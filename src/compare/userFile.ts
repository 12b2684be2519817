import { transfer, wrap } from 'comlink';
import type { FileAnalysis } from '../../lib/io/analyzeFile';
import type { UserDataApi, UserFileOptions } from '../../workers/userData.worker';

/** Largest file the page reads: it is held in memory whole (a netCDF-4 file must be, to be read at all). */
export const MAX_USER_FILE_BYTES = 256 * 1024 * 1024;

/** Analyse a user's file in a worker of its own, ended when done; rejects with the reason the file was refused. */
export async function analyzeUserFile(file: File, options: UserFileOptions): Promise<FileAnalysis> {
  if (file.size > MAX_USER_FILE_BYTES) throw new RangeError(`${file.name} is ${(file.size / 1048576).toFixed(0)} MiB; files up to ${MAX_USER_FILE_BYTES / 1048576} MiB are read here (the command line's \`stria analyze\` reads larger ones record by record)`);
  const bytes = await file.arrayBuffer();
  const worker = new Worker(new URL('../../workers/userData.worker.ts', import.meta.url), { type: 'module' });
  try {
    return await wrap<UserDataApi>(worker).analyze(transfer(bytes, [bytes]), options);
  } finally {
    worker.terminate();
  }
}
