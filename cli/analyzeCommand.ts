import { analyzeFile } from '../lib/userfile/analyzeFile';
import { fileAnalysisText } from '../lib/userfile/report';
import { ANALYZE_OPTIONS as OPTIONS, parseMap, toOptions } from './analyzeOptions';
import { formatOptions, parseArgs, UsageError, type ParsedArgs } from './args';
import { EXIT_OK, EXIT_USAGE, type Command } from './command';
import { CLI_RUNTIME_BYTES } from './commands/run';
import { formatBytes } from '../lib/run/runMemory';
import { UserFileMemoryError } from '../lib/userfile/userFileMemory';
import { fileSource } from './fileSource';

export { parseMap };

/**
 * `stria analyze FILE [options]`: Stria's diagnostics on a NetCDF file it did not write (the
 * library: lib/userfile/analyzeFile.ts). Prints the readable report, or the result object as JSON with
 * --json. Exit codes: 0 done, 2 a mistake in the command line or a file Stria refuses (the message
 * names the file and says what is wrong: damaged, not NetCDF, no field, or too large for the memory
 * budget, with the subsample that would fit). Two entry points: `analyzeCommand(argv)` on its own, and `analyzeCmd` for
 * the dispatcher's command list. The analysis runs synchronously, so an interrupt takes effect
 * when it ends.
 */
const SUMMARY = "apply Stria's diagnostics to a NetCDF file Stria did not write";
const USAGE = 'stria analyze FILE [options]';

const DESCRIPTION = `Apply Stria's diagnostics to a NetCDF file Stria did not write (NetCDF-3 classic or 64-bit offset,
or netCDF-4): zonal means, eddy momentum and PV fluxes, jets and their spacing, the PV staircase,
U_rms, the Rhines scale and the zonostrophy index, spectra and spectral flux on a doubly periodic
grid, and the measured values beside Stria's predictions for the same β, ε and μ. Fields are found
by CF standard_name or common name (u, v, zeta, psi, q, ubar, ...), or named with --map; what does
not apply is listed with the reason. Missing values (_FillValue, missing_value, NaN, outside
valid_range) are left out of every mean. Details: docs/user-files.md.`;

const EXAMPLES = `A beta-plane run in metres with velocities named U and V; time means over the last 20
records; the run's β, ε and μ so that the planner's predictions stand beside the measurements:

  stria analyze run.nc --map u=U,v=V --records -20: --beta 1.6e-11 --eps 1e-5 --mu 1e-6

A longitude/latitude file, mapped onto the plane tangent to the Earth at 45°N (β from the planet;
the report states that the spherical geometry is approximated):

  stria analyze winds.nc --planet earth --lat0 45 --json > winds-analysis.json`;

export const ANALYZE_HELP = `${USAGE}\n\n${DESCRIPTION}\n\nOptions:\n${formatOptions(OPTIONS)}\n\nExample: ${EXAMPLES}\n`;

/** Where the command writes (the dispatcher's CommandIO has these, and more). */
interface Streams {
  out: { write(s: string): unknown };
  err: { write(s: string): unknown; isTTY?: boolean };
}

/** The command for the `stria` dispatcher (cli/command.ts): wire it by listing it in cli/commandList.ts. */
export const analyzeCmd: Command = {
  name: 'analyze',
  summary: SUMMARY,
  usage: USAGE,
  description: DESCRIPTION,
  examples: EXAMPLES,
  options: OPTIONS,
  run: (args, io) => runAnalyze(args, io),
};

/** Runs the command on the words after "analyze"; resolves to the exit code. */
export async function analyzeCommand(argv: string[]): Promise<number> {
  let parsed: ParsedArgs;
  try {
    parsed = parseArgs(argv, OPTIONS, 'analyze');
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    process.stderr.write(`stria analyze: ${e.message}\n`);
    return 2;
  }
  if (parsed.options.help) {
    process.stdout.write(ANALYZE_HELP);
    return 0;
  }
  try {
    return await runAnalyze(parsed, { out: process.stdout, err: process.stderr });
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    process.stderr.write(`stria analyze: ${e.message}\n`);
    return 2;
  }
}

/**
 * The work of the command on parsed arguments: UsageError for a mistake in them (exit 2 by the
 * caller), 1 with a message when the file cannot be analysed, 0 with the report on success.
 */
async function runAnalyze(parsed: ParsedArgs, io: Streams): Promise<number> {
  if (parsed.positionals.length !== 1)
    throw new UsageError(`stria analyze needs one FILE, got ${parsed.positionals.length} (see stria analyze --help)`);
  const path = parsed.positionals[0];
  const options = toOptions(parsed.options);
  const o = parsed.options;
  const showProgress = !o.quiet && !o.json && io.err.isTTY === true;
  if (showProgress)
    options.onProgress = (p) =>
      io.err.write(
        `\rstria analyze: record ${p.index + 1} of ${p.of} (${Math.round((100 * p.done) / Math.max(p.total, 1))}%)   `,
      );
  let source;
  try {
    source = fileSource(path);
  } catch (e) {
    io.err.write(`stria analyze: ${path}: ${openProblem(e as NodeJS.ErrnoException)}\n`);
    return EXIT_USAGE;
  }
  try {
    const result = analyzeFile(source, { ...options, runtimeBytes: CLI_RUNTIME_BYTES });
    if (showProgress) io.err.write('\n');
    io.out.write(o.json ? `${JSON.stringify(result, null, 2)}\n` : fileAnalysisText(result, path));
    return EXIT_OK;
  } catch (e) {
    if (showProgress) io.err.write('\n');
    // A file Stria refuses is a bad file (docs/cli.md: exit 2), named with what is wrong with it.
    if (e instanceof UserFileMemoryError) {
      const advice =
        e.fitsAt !== null
          ? `give --subsample ${e.fitsAt}, or a --memory-budget larger than ${formatBytes(e.estimate.totalBytes)}`
          : `give a --memory-budget larger than ${formatBytes(e.estimate.totalBytes)}`;
      io.err.write(`stria analyze: ${path}: ${e.message}: ${advice}\n`);
      return EXIT_USAGE;
    }
    if (e instanceof RangeError) {
      io.err.write(`stria analyze: ${path}: ${e.message}\n`);
      return EXIT_USAGE;
    }
    throw e;
  } finally {
    source.close();
  }
}

/** Why a file cannot be opened, in words (never the bare ENOENT or EISDIR of the system). */
function openProblem(e: NodeJS.ErrnoException): string {
  if (e.code === 'ENOENT') return 'no such file';
  if (e.code === 'EISDIR') return 'is a folder, not a file';
  if (e.code === 'EACCES' || e.code === 'EPERM') return 'cannot be read: permission denied';
  if (e.code === 'ENOTDIR') return 'a folder on its path is a file';
  return `cannot be opened (${e.code ?? e.message})`;
}
