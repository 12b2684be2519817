import { describe, expect, it } from 'vitest';
import { parseArgs, parseNumber, UsageError, type OptionSpec } from '../../cli/args';
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
    const a = parseArgs(['f.json', '--steps', '10', '--until=2.5', '--json', '--set', 'a=1', '--set=b=2', '--out', 'd', '--', '--x'], specs, 'run');
    expect(a.options).toEqual({ steps: 10, until: 2.5, json: true, set: ['a=1', 'b=2'], out: 'd' });
    expect(a.positionals).toEqual(['f.json', '--x']);
    expect(parseArgs(['-h'], specs, 'run').options.help).toBe(true);
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
    expect(parseSets(['beta=20', 'Lx=2pi', 'force_zonal=false', 'forcing=steady', 'beta=30'])).toEqual({ beta: 30, Lx: 2 * Math.PI, force_zonal: false, forcing: 'steady' });
    expect(() => parseSets(['force_zonal=no'])).toThrow(/force_zonal needs true or false/);
    expect(() => parseSets(['beta'])).toThrow(/expected key=value/);
  });

  it('draws a progress bar that fits its width', () => {
    const line = renderProgress('stria run', 0.5, 't = 10', 30, 60);
    expect(line.length).toBeLessThanOrEqual(60);
    expect(line).toMatch(/^stria run \[#+-+\]  50% t = 10, 30 s left$/);
    const bar = /\[([#-]+)\]/.exec(line)![1];
    expect(bar.split('#').length - 1).toBe(Math.round(bar.length / 2));
  });
});
