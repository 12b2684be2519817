import { describe, expect, it } from 'vitest';
import type { OptionSpec } from '../../cli/args';
import { historyCommand } from '../../cli/historyCommand';

const OPTIONS: OptionSpec[] = [
  { name: 'set', kind: 'list', value: 'KEY=VALUE', help: '' },
  { name: 'zonal', kind: 'text', value: 'FILE', help: '' },
  { name: 'out', kind: 'text', value: 'DIR', help: '' },
  { name: 'shard', kind: 'text', value: 'i/n', help: '' },
  { name: 'json', kind: 'flag', help: '' },
];

describe('historyCommand', () => {
  it('keeps the command and every option, and names files and directories by their last component', () => {
    expect(
      historyCommand(
        'run',
        ['/home/a/runs/p.json', '--set', 'Lx=2pi', '--zonal', '/home/a/out/z.nc', '--json', '--out=../x/res'],
        OPTIONS,
      ),
    ).toBe('stria run p.json --set Lx=2pi --zonal z.nc --json --out=res');
  });

  it('leaves values that are not paths alone, slashes included', () => {
    expect(historyCommand('sweep', ['spec.json', '--shard', '1/4'], OPTIONS)).toBe('stria sweep spec.json --shard 1/4');
  });

  it('takes words after -- as files, and Windows separators as separators', () => {
    expect(historyCommand('run', ['--', 'C:\\data\\p.json'], OPTIONS)).toBe('stria run -- p.json');
  });
});
