import type { OptionSpec, ParsedArgs } from './args';

/**
 * One `stria` subcommand: its name, a line for `stria --help`, its options, and its help text (usage,
 * what it does, and a worked example; the options block is added from `options`). `run` returns the
 * process exit code: 0 done, 1 the work failed, 2 a usage mistake (UsageError), 130 interrupted.
 */
export interface Command {
  name: string;
  summary: string;
  usage: string;
  description: string;
  examples: string;
  options: readonly OptionSpec[];
  run(args: ParsedArgs, io: CommandIO): Promise<number>;
}

/** Where a command writes: standard output for results, standard error for progress and messages. */
export interface CommandIO {
  out: NodeJS.WritableStream;
  err: NodeJS.WriteStream | NodeJS.WritableStream;
  /** The words the command was called with, for NetCDF history attributes. */
  argv: readonly string[];
  /** Set by SIGINT/SIGTERM; long commands stop at the next safe point and exit 130. */
  interrupted(): boolean;
}

export const EXIT_OK = 0;
export const EXIT_FAILED = 1;
export const EXIT_USAGE = 2;
export const EXIT_INTERRUPTED = 130;
