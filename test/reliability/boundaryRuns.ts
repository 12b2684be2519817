/**
 * How hard each boundary is tried: the number of generated inputs (fast-check runs) and the seed of
 * the property test in test/reliability/boundaries.test.ts. docs/reliability.md quotes this table;
 * the test checks that each property ran exactly this many cases.
 */
export interface BoundaryRun {
  id: string;
  boundary: string;
  runs: number;
  seed: number;
}

export const BOUNDARY_RUNS: readonly BoundaryRun[] = [
  { id: 'params', boundary: 'model parameters: validateParams (lib/model/validateParams.ts)', runs: 2000, seed: 1101 },
  { id: 'runFile', boundary: 'run files: decodeRunFile (lib/io/runFile.ts)', runs: 1000, seed: 1102 },
  {
    id: 'checkpointFile',
    boundary: 'checkpoint files: decodeCheckpointFile (lib/run/runProgress.ts)',
    runs: 500,
    seed: 1103,
  },
  { id: 'sweepSpec', boundary: 'sweep specs: parseSweepSpec + expandSweep (lib/sweep)', runs: 2000, seed: 1104 },
  {
    id: 'sweepRecord',
    boundary: 'sweep journal lines: parseSweepRecord (lib/sweep/sweepRecord.ts)',
    runs: 1000,
    seed: 1105,
  },
  {
    id: 'planInput',
    boundary: 'plan inputs: validatePlanInput + analysePlan (lib/plan/planInput.ts)',
    runs: 2000,
    seed: 1106,
  },
  { id: 'planFile', boundary: 'plan files: parsePlanFile (lib/plan/planFile.ts)', runs: 1000, seed: 1107 },
  { id: 'runLink', boundary: 'shared links: decodeRunLink (src/share/runLink.ts)', runs: 2000, seed: 1108 },
  { id: 'netcdf', boundary: 'NetCDF bytes: readNetcdf (lib/io/netcdfRead.ts)', runs: 2000, seed: 1109 },
  {
    id: 'userFile',
    boundary: "users' NetCDF-3 and netCDF-4 files: analyzeFile (lib/userfile/analyzeFile.ts)",
    runs: 1000,
    seed: 1111,
  },
  {
    id: 'cliWords',
    boundary: 'command-line words: parseArgs, parseSets, parseByteSize (cli/)',
    runs: 1000,
    seed: 1110,
  },
];

/** Longest a single generated case may take before it counts as a hang. */
export const CASE_LIMIT_MS = 5000;
