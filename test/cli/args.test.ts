import { describe, expect, it } from 'vitest';
import { parseArgs, parseNumber, UsageError, type OptionSpec } from '../../cli/args';
import { commandHelp, main } from '../../cli/main';
import { runCommand } from '../../cli/commands/run';
import { parseSets } from '../../cli/paramInput';
import { renderProgress } from '../../cli/progressBar';

const specs: OptionSpec[] = [
  { name: 'steps', kind: 'count', help: '' },
  { name: 'until', kind: 'number', help: '' },
  { name: 'json', kind: 'flag', help: '' },
  { name: 'out', kind: 'text', help: '' },
  { name: 'set', kind: 'list', help: '' },
];

const usage = (argv: string[]) => {
  try {
    parseArgs(argv, specs, 'run');
  } catch (e) {
    if (e instanceof UsageError) return e.message;
    throw e;
  }
  return 'accepted';
};

describe('option parsing', () => {
  it('reads each kind, both spellings, positionals and --', () => {
    const a = parseArgs(
      ['f.json', '--steps', '10', '--until=2.5', '--json', '--set', 'a=1', '--set=b=2', '--out', 'd', '--', '--x'],
      specs,
      'run',
    );
    expect(a.options).toEqual({ steps: 10, until: 2.5, json: true, set: ['a=1', 'b=2'], out: 'd' });
    expect(a.positionals).toEqual(['f.json', '--x']);
    expect(parseArgs(['-h'], specs, 'run').options.help).toBe(true);
  });

  it('reads an older name of an option as the option, once, and says it in help', () => {
    const renamed: OptionSpec[] = [{ name: 'snapshot-every-steps', kind: 'count', help: 'steps', aliases: ['every'] }];
    expect(parseArgs(['--every', '5'], renamed, 'run').options).toEqual({ 'snapshot-every-steps': 5 });
    expect(parseArgs(['--every=5'], renamed, 'run').options).toEqual({ 'snapshot-every-steps': 5 });
    expect(() => parseArgs(['--every', '5', '--snapshot-every-steps', '6'], renamed, 'run')).toThrow(/given twice/);
  });

  it('names the unit of every step count and time option of stria run', () => {
    const help = commandHelp(runCommand);
    for (const [name, unit] of [
      ['snapshot-every-steps', /step count/],
      ['checkpoint-every-steps', /step count/],
      ['sample-interval', /model time/],
      ['average', /model time/],
      ['steady-window', /model time/],
      ['max-time', /model time/],
    ] as const) {
      const spec = runCommand.options.find((o) => o.name === name);
      expect(spec?.help, name).toMatch(unit);
    }
    // The old names still parse, as the same options.
    const o = parseArgs(
      ['--every', '5', '--checkpoint-every', '7', '--sample-every', '0.5'],
      runCommand.options,
      'run',
    );
    expect(o.options).toMatchObject({ 'snapshot-every-steps': 5, 'checkpoint-every-steps': 7, 'sample-interval': 0.5 });
    expect(help).toMatch(/its older name --every still works/);
  });

  it('refuses unknown, repeated, valueless and mistyped options by name', () => {
    expect(usage(['--stpes', '3'])).toMatch(/unknown option --stpes \(see stria run --help\)/);
    expect(usage(['-s'])).toMatch(/unknown option -s/);
    expect(usage(['--steps', '1', '--steps', '2'])).toMatch(/--steps is given twice/);
    expect(usage(['--steps'])).toMatch(/--steps needs a value/);
    expect(usage(['--steps', '2.5'])).toMatch(/--steps needs a positive whole number, got "2.5"/);
    expect(usage(['--until', '1,5'])).toMatch(/--until needs a number, got "1,5"/);
    expect(usage(['--json=yes'])).toMatch(/--json takes no value/);
  });

  // The edges where a general-purpose option parser might answer otherwise; today's answers are kept.
  const labelled: OptionSpec[] = [
    { name: 'steps', kind: 'count', value: 'N', help: '' },
    { name: 'lat0', kind: 'number', value: 'DEG', help: '' },
    { name: 'records', kind: 'text', value: 'A:B', help: '' },
    { name: 'no-spectra', kind: 'flag', help: '' },
  ];
  const refusal = (argv: string[], s: readonly OptionSpec[] = specs) => {
    try {
      parseArgs(argv, s, 'run');
    } catch (e) {
      if (e instanceof UsageError) return e.message;
      throw e;
    }
    return 'accepted';
  };

  it('takes the next word as the value even when it starts with a dash', () => {
    expect(parseArgs(['--until', '-3', '--set', 'beta=-1', '--set', '-x'], specs, 'run').options).toEqual({
      until: -3,
      set: ['beta=-1', '-x'],
    });
    expect(parseArgs(['--lat0', '-45', '--records', '-20:'], labelled, 'run').options).toEqual({
      lat0: -45,
      records: '-20:',
    });
    expect(parseArgs(['--out', '--json'], specs, 'run')).toEqual({ options: { out: '--json' }, positionals: [] });
    expect(parseArgs(['--out', '-h'], specs, 'run')).toEqual({ options: { out: '-h' }, positionals: [] });
    // "--" taken as a value does not end the options.
    expect(parseArgs(['--out', '--', '--json', 'f'], specs, 'run')).toEqual({
      options: { out: '--', json: true },
      positionals: ['f'],
    });
    expect(refusal(['--steps', '--'])).toBe('option --steps needs a positive whole number, got "--"');
    expect(refusal(['--until', '-x'])).toBe('option --until needs a number, got "-x"');
  });

  it('splits --name=value at the first =, and an empty value is a value', () => {
    expect(parseArgs(['--until=-3', '--set=a=b=c', '--out='], specs, 'run').options).toEqual({
      until: -3,
      set: ['a=b=c'],
      out: '',
    });
    expect(refusal(['--steps='])).toBe('option --steps needs a positive whole number, got ""');
    expect(refusal(['--json='])).toBe('option --json takes no value, got ""');
    expect(refusal(['--help=x'])).toBe('option --help takes no value, got "x"');
  });

  it('says which value a valueless option lacks', () => {
    expect(refusal(['--steps'])).toBe('option --steps needs a value (a value)');
    expect(refusal(['--records'], labelled)).toBe('option --records needs a value (A:B)');
    expect(refusal(['--json', '--out'])).toBe('option --out needs a value (a value)');
  });

  it('knows no --no- negation: a flag named no-... is a flag of its own', () => {
    expect(parseArgs(['--no-spectra'], labelled, 'run').options).toEqual({ 'no-spectra': true });
    expect(refusal(['--no-json'])).toBe('unknown option --no-json (see stria run --help)');
    expect(refusal(['--no-spectra'])).toBe('unknown option --no-spectra (see stria run --help)');
  });

  it('names unknown options as written, up to any =', () => {
    expect(refusal(['--stpes=3'])).toBe('unknown option --stpes (see stria run --help)');
    expect(refusal(['---x'])).toBe('unknown option ---x (see stria run --help)');
    expect(refusal(['--=x'])).toBe('unknown option -- (see stria run --help)');
    expect(refusal(['--__proto__=1'])).toBe('unknown option --__proto__ (see stria run --help)');
    expect(refusal(['--constructor'])).toBe('unknown option --constructor (see stria run --help)');
  });

  it('has one short option, -h; any other dash word is refused whole', () => {
    const short = (w: string) => `unknown option ${w}: options are long, such as --help (see stria run --help)`;
    for (const w of ['-s', '-3', '-hx', '-xh', '-h=x', '-1.5', '-json']) expect(refusal([w])).toBe(short(w));
    expect(refusal(['--until', '2', '-3'])).toBe(short('-3'));
    expect(parseArgs(['-', '', 'a'], specs, 'run')).toEqual({ options: {}, positionals: ['-', '', 'a'] });
    expect(parseArgs(['-h', '--help', '-h'], specs, 'run')).toEqual({ options: { help: true }, positionals: [] });
  });

  it('ends the options at --, after which every word is a positional', () => {
    expect(parseArgs(['a', '--json', 'b', '--', '-h', '--', '--steps', '-x'], specs, 'run')).toEqual({
      options: { json: true },
      positionals: ['a', 'b', '-h', '--', '--steps', '-x'],
    });
  });

  it('lets flags and lists repeat but not other options, and reports the first mistake in the line', () => {
    expect(parseArgs(['--json', '--json', '--set', 'a=1', '--set', 'a=2'], specs, 'run').options).toEqual({
      json: true,
      set: ['a=1', 'a=2'],
    });
    expect(refusal(['--out', 'a', '--out=b'])).toBe('option --out is given twice');
    expect(refusal(['--steps', 'x', '--steps', '2'])).toBe('option --steps needs a positive whole number, got "x"');
    expect(refusal(['--steps', '2', '--steps', 'x'])).toBe('option --steps is given twice');
    expect(refusal(['--stpes', '--steps', '0'])).toBe('unknown option --stpes (see stria run --help)');
    expect(refusal(['--steps', '0', '--stpes'])).toBe('option --steps needs a positive whole number, got "0"');
    expect(refusal(['-x', '--stpes'])).toMatch(/^unknown option -x: /);
  });

  it('answers a command-line mistake on standard error with exit code 2, and -h with the help and 0', async () => {
    const call = async (argv: string[]) => {
      let out = '';
      let err = '';
      const io = {
        out: { write: (s: string) => ((out += s), true) },
        err: { write: (s: string) => ((err += s), true) },
        argv,
        interrupted: () => false,
      };
      return { code: await main(argv, io as never), out, err };
    };
    expect(await call(['run', '--steps', '5', '-s'])).toEqual({
      code: 2,
      out: '',
      err: 'stria run: error: unknown option -s: options are long, such as --help (see stria run --help)\n',
    });
    expect(await call(['run', '--until'])).toEqual({
      code: 2,
      out: '',
      err: 'stria run: error: option --until needs a value (T)\n',
    });
    expect(await call(['run', '--stpes', '3', '-h'])).toMatchObject({ code: 2, out: '' });
    expect(await call(['run', '--set', 'beta=-1', '-h'])).toEqual({ code: 0, out: commandHelp(runCommand), err: '' });
  });

  it('reads numbers as written, and multiples of pi', () => {
    expect(parseNumber('1e-3')).toBe(1e-3);
    expect(parseNumber('.5')).toBe(0.5);
    expect(parseNumber('-2')).toBe(-2);
    expect(parseNumber('pi')).toBe(Math.PI);
    expect(parseNumber('2pi')).toBe(2 * Math.PI);
    expect(parseNumber('0.5*pi')).toBe(0.5 * Math.PI);
    for (const bad of ['', '0x10', '1e', 'one', 'Infinity', 'pipi']) expect(parseNumber(bad)).toBeNaN();
  });

  it('reads --set values as the parameter types, later values winning', () => {
    expect(parseSets(['beta=20', 'Lx=2pi', 'force_zonal=false', 'forcing=steady', 'beta=30'])).toEqual({
      beta: 30,
      Lx: 2 * Math.PI,
      force_zonal: false,
      forcing: 'steady',
    });
    expect(() => parseSets(['force_zonal=no'])).toThrow(/force_zonal needs true or false/);
    expect(() => parseSets(['beta'])).toThrow(/expected key=value/);
  });

  it('draws a progress bar that fits its width', () => {
    const line = renderProgress('stria run', 0.5, 't = 10', 30, 60);
    expect(line.length).toBeLessThanOrEqual(60);
    expect(line).toMatch(/^stria run \[#+-+\] {2}50% t = 10, 30 s left$/);
    const bar = /\[([#-]+)\]/.exec(line)![1];
    expect(bar.split('#').length - 1).toBe(Math.round(bar.length / 2));
  });
});
