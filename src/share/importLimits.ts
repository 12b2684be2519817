import { formatBytes } from '../../lib/run/runMemory';

/** The files the page reads from the user's disk. */
export type ImportKind = 'runFile' | 'planFile' | 'sweepResults' | 'userData';

export interface ImportLimit {
  /** What the file is, in the plural, for the message: "run files". */
  what: string;
  maxBytes: number;
  /** Where a larger file can go instead, when somewhere can. */
  elsewhere?: string;
}

const MiB = 1024 * 1024;

/**
 * The largest file of each kind the page reads. Every one is read whole into the page's memory
 * (a netCDF-4 file must be, to be read at all), so each kind has a ceiling well above what a real
 * file of that kind holds and well below what would strain a tab:
 *   run files       a run file of the largest grid (1024², lib/io/runFile.ts) is about 10.7 MiB
 *   plan files      a plan file (lib/plan/planFile.ts) is a few KiB of JSON
 *   sweep results   runs.jsonl, table.json or table.csv of a sweep of some ten thousand runs
 *   NetCDF files    user data for the Compare view, analysed in a worker of its own
 * The checks happen before a byte is read (File.size), in src/controls/ShareKeep.svelte,
 * src/plan/PlanFiles.svelte, src/views/SweepView.svelte and src/compare/userFile.ts.
 */
export const IMPORT_LIMITS: Readonly<Record<ImportKind, ImportLimit>> = {
  runFile: { what: 'run files', maxBytes: 16 * MiB },
  planFile: { what: 'plan files', maxBytes: 1 * MiB },
  sweepResults: { what: 'sweep results', maxBytes: 20 * MiB },
  userData: {
    what: 'NetCDF files',
    maxBytes: 256 * MiB,
    elsewhere: "the command line's `stria analyze` reads larger ones record by record",
  },
};

/** A limit in words: "16 MiB" (limits are whole mebibytes). */
export function limitText(kind: ImportKind): string {
  return `${IMPORT_LIMITS[kind].maxBytes / MiB} MiB`;
}

/**
 * Why a file is too large to read here, naming the file, its size and the limit, or null when it
 * is not: "huge.json is 40.0 MiB; run files up to 16 MiB are read here" (a clause: callers go on).
 */
export function importRefusal(kind: ImportKind, file: { name: string; size: number }): string | null {
  const limit = IMPORT_LIMITS[kind];
  if (file.size <= limit.maxBytes) return null;
  const more = limit.elsewhere ? ` (${limit.elsewhere})` : '';
  return `${file.name} is ${formatBytes(file.size)}; ${limit.what} up to ${limitText(kind)} are read here${more}`;
}
