import fc from 'fast-check';
import { parseArgs, UsageError } from '../../../cli/args';
import { parseByteSize } from '../../../cli/byteSize';
import { runCommand } from '../../../cli/commands/run';
import { parseSets } from '../../../cli/paramInput';
import { DEFAULT_PARAMS } from '../../../lib/model/params';
import { PropertyFailure, type Boundary } from '../support/boundary';
import { trickyKey } from '../support/weird';

/**
 * The command line's own readers of words: parseArgs against `stria run`'s options, parseSets of
 * --set words, parseByteSize of --memory-budget. A refusal is a UsageError naming the option or
 * word (NaN for a size); an acceptance gives only declared options, only real parameters, each with
 * the value its word says, and sizes that are whole positive numbers of bytes.
 */
const optionName = fc.oneof(
  fc.constantFrom(...runCommand.options.map((o) => o.name), 'help', 'stpes'),
  fc.string({ maxLength: 5 }),
);
const value = fc.oneof(
  fc.constantFrom('', '0', '1', '-1', '1e3', '2pi', 'pi', '0x10', 'NaN', 'Infinity', '1.5', ' 7 ', 'stop', 'retry'),
  fc.string({ maxLength: 6 }),
);
const word = fc.oneof(
  fc.tuple(optionName, value).map(([n, x]) => `--${n}=${x}`),
  optionName.map((n) => `--${n}`),
  value,
  fc.constantFrom('--', '-', '-h', '-x'),
);
const setWord = fc
  .tuple(
    fc.oneof(fc.constantFrom(...Object.keys(DEFAULT_PARAMS)), trickyKey, fc.string({ maxLength: 4 })),
    value,
    fc.boolean(),
  )
  .map(([k, x, eq]) => (eq ? `${k}=${x}` : `${k}${x}`));
const size = fc.oneof(
  fc
    .tuple(
      fc.constantFrom('0', '1', '1.5', '2', '.5', '1e3', '-1', 'x', '', '1e400'),
      fc.constantFrom('', 'B', 'KiB', 'MiB', 'GiB', 'TiB', 'kB', 'MB', 'GB', 'gib', 'G', 'EiB', ' MiB'),
    )
    .map(([n, u]) => n + u),
  fc.string({ maxLength: 8 }),
);

type Input = { kind: 'args'; words: string[] } | { kind: 'sets'; words: string[] } | { kind: 'size'; text: string };

export const boundary: Boundary<Input> = {
  arbitrary: fc.oneof(
    fc.array(word, { maxLength: 6 }).map((words) => ({ kind: 'args' as const, words })),
    fc.array(setWord, { maxLength: 3 }).map((words) => ({ kind: 'sets' as const, words })),
    size.map((text) => ({ kind: 'size' as const, text })),
  ),
  check(input) {
    if (input.kind === 'size') {
      const b = parseByteSize(input.text);
      if (Number.isNaN(b)) return 'size refused';
      if (!(Number.isInteger(b) && b > 0)) throw new PropertyFailure(`parseByteSize("${input.text}") = ${b}`);
      return 'size accepted';
    }
    try {
      if (input.kind === 'args') {
        const r = parseArgs(input.words, runCommand.options, 'run');
        const names = new Set([...runCommand.options.map((o) => o.name), 'help']);
        for (const k of Object.keys(r.options))
          if (!names.has(k)) throw new PropertyFailure(`parseArgs accepted an undeclared option --${k}`);
        return 'args accepted';
      }
      const changes = parseSets(input.words) as Record<string, unknown>;
      for (const [k, x] of Object.entries(changes)) {
        if (!Object.hasOwn(DEFAULT_PARAMS, k))
          throw new PropertyFailure(`parseSets accepted "${k}", which is not a parameter`);
        if (typeof x !== typeof DEFAULT_PARAMS[k as keyof typeof DEFAULT_PARAMS])
          throw new PropertyFailure(`parseSets gave ${k} a ${typeof x}`);
      }
      // Every word accepted must be in the result: a word quietly dropped runs another experiment.
      for (const w of input.words) {
        const k = w.slice(0, w.indexOf('='));
        if (!Object.hasOwn(changes, k)) throw new PropertyFailure(`parseSets accepted --set ${w} but dropped it`);
      }
      return 'sets accepted';
    } catch (e) {
      if (e instanceof PropertyFailure) throw e;
      if (!(e instanceof UsageError))
        throw new PropertyFailure(
          `threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}, not a UsageError`,
        );
      if (!/--|option|parameter/.test(e.message))
        throw new PropertyFailure(`the refusal names no option or word: ${e.message}`);
      return 'refused';
    }
  },
};
