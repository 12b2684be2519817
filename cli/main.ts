import { formatOptions, parseArgs, UsageError } from './args';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, type Command, type CommandIO } from './command';
import { COMMANDS } from './commandList';
import { striaVersion } from './version';

/**
 * The `stria` command line: `stria COMMAND [options]`. The commands are listed in cli/commandList.ts;
 * adding one there is all it takes to reach it from here, its help and `stria --help`.
 */
export function commandHelp(c: Command): string {
  return [
    `stria ${c.name} — ${c.summary}`,
    '',
    `Usage: ${c.usage}`,
    '',
    c.description.trim(),
    '',
    'Options:',
    formatOptions(c.options),
    '',
    'Example:',
    c.examples.replace(/^\n+/, '').trimEnd(),
    '',
  ].join('\n');
}

export function topHelp(): string {
  const width = Math.max(...COMMANDS.map((c) => c.name.length));
  return [
    `stria ${striaVersion()} — zonal jets on the beta-plane: run, sweep and plan a forced-dissipative quasi-geostrophic model`,
    '',
    'Usage: stria COMMAND [options]      stria COMMAND --help for its options and an example',
    '',
    'Commands:',
    ...COMMANDS.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
    '',
    'Example:',
    '  stria run --preset jets --set nx=64 --set ny=64 --until 50 --json',
    '',
    'Exit codes: 0 done, 1 the work failed, 2 a usage mistake, 130 interrupted.',
    '',
  ].join('\n');
}

/** Run `stria` with the words after the program name; resolves to the exit code. */
export async function main(argv: readonly string[], io: CommandIO = processIO(argv)): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined) {
    io.err.write(topHelp());
    return EXIT_USAGE;
  }
  if (name === '--help' || name === '-h' || name === 'help') {
    const c = COMMANDS.find((x) => x.name === rest[0]);
    io.out.write(c ? commandHelp(c) : topHelp());
    return EXIT_OK;
  }
  if (name === '--version') {
    io.out.write(`${striaVersion()}\n`);
    return EXIT_OK;
  }
  const command = COMMANDS.find((c) => c.name === name);
  if (!command) {
    io.err.write(
      `stria: unknown command "${name}" (commands: ${COMMANDS.map((c) => c.name).join(', ')}; see stria --help)\n`,
    );
    return EXIT_USAGE;
  }
  try {
    const args = parseArgs(rest, command.options, command.name);
    if (args.options.help) {
      io.out.write(commandHelp(command));
      return EXIT_OK;
    }
    return await command.run(args, io);
  } catch (e) {
    const usage = e instanceof UsageError;
    io.err.write(`stria ${command.name}: error: ${e instanceof Error ? e.message : String(e)}\n`);
    if (process.env.STRIA_DEBUG && e instanceof Error && e.stack) io.err.write(`${e.stack}\n`);
    return usage ? EXIT_USAGE : EXIT_FAILED;
  }
}

/** The process's streams, and an interrupt flag set by the first SIGINT or SIGTERM (the second ends at once). */
export function processIO(argv: readonly string[]): CommandIO {
  let stop = false;
  const onSignal = (signal: NodeJS.Signals) => {
    if (stop) process.exit(130);
    stop = true;
    process.stderr.write(`\nstria: ${signal}: stopping at the next safe point (again to quit at once)\n`);
  };
  process.on('SIGINT', onSignal);
  process.on('SIGTERM', onSignal);
  return { out: process.stdout, err: process.stderr, argv, interrupted: () => stop };
}
