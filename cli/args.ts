import { parseArgs as tokenize, type ParseArgsConfig } from 'node:util';

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
  /** Older names still accepted, so scripts written for them keep working (read as `name`). */
  aliases?: readonly string[];
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

/**
 * Parse `argv` (the words after the command name) against `specs`; throws UsageError at the first
 * mistake in the line. Node's parseArgs splits the words into tokens; it runs with strict off because
 * strict mode refuses a value that starts with a dash (`--lat0 -45`, `--records -20:`) and words its
 * own messages. The checks strict mode would make are made here instead, token by token, in Stria's words.
 */
export function parseArgs(argv: readonly string[], specs: readonly OptionSpec[], command: string): ParsedArgs {
  const byName = new Map(
    [...specs, HELP_OPTION].flatMap((s) => [s.name, ...(s.aliases ?? [])].map((n) => [n, s] as const)),
  );
  const { tokens } = tokenize({
    args: [...argv],
    options: nodeOptions(byName),
    strict: false,
    allowPositionals: true,
    tokens: true,
  });
  const options: Record<string, OptionValue | undefined> = {};
  const positionals: string[] = [];
  const see = `(see stria ${command} --help)`;
  for (const token of tokens) {
    if (token.kind === 'positional') {
      positionals.push(token.value);
      continue;
    }
    if (token.kind === 'option-terminator') continue;
    // Node reads "-xy" as -x -y; a dash word other than -h is refused whole, as written.
    const word = argv[token.index];
    if (!word.startsWith('--')) {
      if (word !== '-h') throw new UsageError(`unknown option ${word}: options are long, such as --help ${see}`);
      options.help = true;
      continue;
    }
    const spec = byName.get(token.name);
    // Named as written up to any '=' (Node calls "--=x" an option named "=x"; the message says "--").
    if (!spec) throw new UsageError(`unknown option ${word.split('=', 1)[0]} ${see}`);
    const name = spec.name;
    if (spec.kind === 'flag') {
      if (token.value !== undefined) throw new UsageError(`option --${name} takes no value, got "${token.value}"`);
      options[name] = true;
      continue;
    }
    // A value option takes the next word whatever it is, even "--" or "-3"; only the end of the line lacks one.
    const text = token.value;
    if (text === undefined) throw new UsageError(`option --${name} needs a value (${spec.value ?? 'a value'})`);
    if (spec.kind === 'list') {
      options[name] = [...((options[name] as string[] | undefined) ?? []), text];
      continue;
    }
    if (options[name] !== undefined)
      throw new UsageError(
        `option --${name} is given twice${spec.aliases?.length ? ` (--${spec.aliases.join(', --')} is another name for it)` : ''}`,
      );
    options[name] = convert(spec, text);
  }
  return { options, positionals };
}

/** The declarations as Node's parseArgs wants them: flags are booleans, every other kind takes a string. */
function nodeOptions(byName: ReadonlyMap<string, OptionSpec>): NonNullable<ParseArgsConfig['options']> {
  const out: NonNullable<ParseArgsConfig['options']> = {};
  for (const [name, spec] of byName)
    out[name] = spec.kind === 'flag' ? { type: 'boolean' } : { type: 'string', multiple: spec.kind === 'list' };
  out.help = { type: 'boolean', short: 'h' };
  return out;
}

function convert(spec: OptionSpec, text: string): OptionValue {
  if (spec.kind === 'text') return text;
  const x = parseNumber(text);
  if (spec.kind === 'number') {
    if (!Number.isFinite(x)) throw new UsageError(`option --${spec.name} needs a number, got "${text}"`);
    return x;
  }
  if (!(Number.isInteger(x) && x > 0))
    throw new UsageError(`option --${spec.name} needs a positive whole number, got "${text}"`);
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
      const lines = [
        ...s.help.split('\n'),
        ...(s.aliases?.length ? [`(its older name --${s.aliases.join(', --')} still works)`] : []),
      ];
      const first =
        head.length > width ? `  ${head}\n  ${' '.repeat(width)}  ${lines[0]}` : `  ${head.padEnd(width)}  ${lines[0]}`;
      return [first, ...lines.slice(1).map((l) => `  ${' '.repeat(width)}  ${l}`)].join('\n');
    })
    .join('\n');
}
