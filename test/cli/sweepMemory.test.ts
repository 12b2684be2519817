import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { scratchDir, striaHere } from './support/stria';

const dir = scratchDir('sweep-memory');

describe('stria sweep memory budget', () => {
  it('refuses runs at a time that would not fit, before writing anything, and says how many would', async () => {
    const spec = join(dir, 'big.json');
    writeFileSync(
      spec,
      JSON.stringify({
        base: { nx: 512, ny: 512, kf: 24, dkf: 2 },
        vary: [{ param: 'beta', values: [5, 10, 20] }],
        length: { steps: 10 },
      }),
    );
    const out = join(dir, 'big-results');
    const r = await striaHere(['sweep', spec, '--out', out, '--jobs', '3', '--memory-budget', '400MiB']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(
      /3 runs at a time need about [\d.]+ MiB \(the largest, 512 × 512, about [\d.]+ MiB with its worker\), more than the memory budget of 400 MiB: give --jobs 2 or a larger --memory-budget/,
    );
    expect(existsSync(out)).toBe(false);
    const none = await striaHere(['sweep', spec, '--out', out, '--jobs', '1', '--memory-budget', '100MiB']);
    expect(none.stderr).toMatch(/even one run does not fit/);
  });
});
