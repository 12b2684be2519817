/**
 * Options of a `stria` command, declared once: the parser, the help text and the error messages all
 * come from the declaration. Long options only (`--name value` or `--name=value`), plus `-h`; `--`
 * ends the options. Anything undeclared is an error naming it, so a misspelt option never runs a
 * different experiment than the one meant.
 */
export type OptionKind = 'flag' | 'text' | 'number' | 'count' | 'list';

export interface OptionSpec {
  name: string;
  kind: OptionKind;
  /** Shown after the option in help, e.g. FILE, N, T. */
  value?: string;
  help: string;
}

export type OptionValue = boolean | string | number | string[];

export interface ParsedArgs {
  options: Record<string, OptionValue | undefined>;
  positionals: string[];
}

/** A mistake in how a command was called: exit code 2, message on standard error. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

export const HELP_OPTION: OptionSpec = { name: 'help', kind: 'flag', help: 'show this help and exit' };

/** Parse `argv` (the words after the command name) against `specs`; throws UsageError. */
export function parseArgs(argv: readonly string[], specs: readonly OptionSpec[], command: string): ParsedArgs {
  const byName = new Map(specs.map((s) => [s.name, s]));
  const options: Record<string, OptionValue | undefined> = {};
  const positionals: string[] = [];
  const see = `(see stria ${command} --help)`;
  for (let i = 0; i < argv.length; i++) {
    const word = argv[i];
    if (word === '--') {
      positionals.push(...argv.slice(i + 1));
      break;
    }
    if (word === '-h') {
      options.help = true;
      continue;
    }
    if (!word.startsWith('-') || word === '-') {
      positionals.push(word);
      continue;
    }
    if (!word.startsWith('--')) throw new UsageError(`unknown option ${word}: options are long, such as --help ${see}`);
    const eq = word.indexOf('=');
    const name = word.slice(2, eq < 0 ? undefined : eq);
    const spec = name === 'help' ? HELP_OPTION : byName.get(name);
    if (!spec) throw new UsageError(`unknown option --${name} ${see}`);
    if (spec.kind === 'flag') {
      if (eq >= 0) throw new UsageError(`option --${name} takes no value, got "${word.slice(eq + 1)}"`);
      options[name] = true;
      continue;
    }
    let text: string;
    if (eq >= 0) text = word.slice(eq + 1);
    else {
      if (i + 1 >= argv.length) throw new UsageError(`option --${name} needs a value (${spec.value ?? 'a value'})`);
      text = argv[++i];
    }
    if (spec.kind === 'list') {
      options[name] = [...((options[name] as string[] | undefined) ?? []), text];
      continue;
    }
    if (options[name] !== undefined) throw new UsageError(`option --${name} is given twice`);
    options[name] = convert(spec, text);
  }
  return { options, positionals };
}

function convert(spec: OptionSpec, text: string): OptionValue {
  if (spec.kind === 'text') return text;
  const x = parseNumber(text);
  if (spec.kind === 'number') {
    if (!Number.isFinite(x)) throw new UsageError(`option --${spec.name} needs a number, got "${text}"`);
    return x;
  }
  if (!(Number.isInteger(x) && x > 0)) throw new UsageError(`option --${spec.name} needs a positive whole number, got "${text}"`);
  return x;
}

/**
 * A decimal number as people write them (1e-3, .5, -2), or a multiple of π ("pi", "2pi", "0.5pi"),
 * since domain lengths are multiples of π. NaN for anything else (hex, empty text, "1,5").
 */
export function parseNumber(text: string): number {
  const t = text.trim();
  const pi = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)?\*?pi$/i.exec(t);
  if (pi) return (pi[1] === undefined ? 1 : Number(pi[1])) * Math.PI;
  return /^[+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?$/i.test(t) ? Number(t) : NaN;
}

/** The options block of a help text. */
export function formatOptions(specs: readonly OptionSpec[]): string {
  const all = [...specs, HELP_OPTION];
  const heads = all.map((s) => `--${s.name}${s.kind === 'flag' ? '' : ` ${s.value ?? 'VALUE'}`}`);
  const width = Math.min(28, Math.max(...heads.map((h) => h.length)));
  return all
    .map((s, i) => {
      const head = heads[i];
      const lines = s.help.split('\n');
      const first = head.length > width ? `  ${head}\n  ${' '.repeat(width)}  ${lines[0]}` : `  ${head.padEnd(width)}  ${lines[0]}`;
      return [first, ...lines.slice(1).map((l) => `  ${' '.repeat(width)}  ${l}`)].join('\n');
    })
    .join('\n');
}
