import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';

// The built app's JavaScript, workers included, stays under the project's budget of 300 kB gzipped
// (gzip level 9, as a static server would send it). Runs on dist/ after `vite build`.
const ASSETS = join(import.meta.dirname, '..', 'dist', 'assets');
const BUDGET_BYTES = 300 * 1000;

describe('shipped JavaScript', () => {
  it('is under 300 kB gzipped, workers included', () => {
    const scripts = readdirSync(ASSETS).filter((f) => f.endsWith('.js'));
    expect(
      scripts.some((f) => f.includes('worker')),
      'the workers are among the assets',
    ).toBe(true);
    const sizes = scripts.map((f) => ({ f, gz: gzipSync(readFileSync(join(ASSETS, f)), { level: 9 }).length }));
    const total = sizes.reduce((s, x) => s + x.gz, 0);
    expect(total, sizes.map((x) => `${x.f} ${x.gz}`).join(', ')).toBeLessThan(BUDGET_BYTES);
  });
});
