import { expose } from 'comlink';
import { analyzeFile, type AnalyzeFileOptions, type FileAnalysis } from '../lib/userfile/analyzeFile';
import { memorySource } from '../lib/io/byteSource';

/** The options the page may give: everything but the callbacks and the meter, which stay here. */
export type UserFileOptions = Omit<AnalyzeFileOptions, 'onProgress' | 'meter'>;

/**
 * Analyses a user's NetCDF file off the page's thread (a large file takes seconds): the bytes come
 * transferred, the result goes back as plain data (lib/userfile/analyzeFile.ts: valid JSON as it is).
 */
export interface UserDataApi {
  analyze(bytes: ArrayBuffer, options: UserFileOptions): FileAnalysis;
}

expose({
  analyze: (bytes: ArrayBuffer, options: UserFileOptions) => analyzeFile(memorySource(bytes), options),
} satisfies UserDataApi);
