import { expose } from 'comlink';
import { analyzeFile, type AnalyzeFileOptions, type FileAnalysis } from '../lib/userfile/analyzeFile';
import { memorySource } from '../lib/io/byteSource';
import { UserFileMemoryError } from '../lib/userfile/userFileMemory';

/** The options the page may give: everything but the callbacks and the meter, which stay here. */
export type UserFileOptions = Omit<AnalyzeFileOptions, 'onProgress' | 'meter'>;

/**
 * Analyses a user's NetCDF file off the page's thread (a large file takes seconds): the bytes come
 * transferred, the result goes back as plain data (lib/userfile/analyzeFile.ts: valid JSON as it is).
 * The page gives its memory budget; an analysis over it is refused before anything is allocated.
 */
export interface UserDataApi {
  analyze(bytes: ArrayBuffer, options: UserFileOptions): FileAnalysis;
}

expose({
  analyze: (bytes: ArrayBuffer, options: UserFileOptions) => {
    try {
      return analyzeFile(memorySource(bytes), options);
    } catch (e) {
      // Over the page's memory budget: say what the page offers instead (a subsample), or the command line.
      if (e instanceof UserFileMemoryError)
        throw new RangeError(
          e.fitsAt !== null
            ? `${e.message}: set "every K-th point" to ${e.fitsAt} or more, or analyse the whole grid with stria analyze on a machine with more memory`
            : `${e.message}: analyse it with stria analyze on a machine with more memory`,
          { cause: e },
        );
      throw e;
    }
  },
} satisfies UserDataApi);
