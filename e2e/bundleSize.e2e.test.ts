import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';

// The built app's JavaScript stays within the project's two budgets (gzip level 9, as a static server
// would send it). Runs on dist/ after `vite build`.
// - What a visitor waits for before the default scenario runs: the entry script, the chunks index.html
//   preloads and the simulation worker, under 150 kB.
// - Everything, the views loaded on first opening and the user-file reader worker (two format readers)
//   included, under 400 kB.
const DIST = join(import.meta.dirname, '..', 'dist');
const ASSETS = join(DIST, 'assets');
const FIRST_LOAD_BUDGET = 150 * 1000;
const TOTAL_BUDGET = 400 * 1000;

const gz = (file: string) => gzipSync(readFileSync(join(ASSETS, file)), { level: 9 }).length;
const list = (files: { f: string; gz: number }[]) => files.map((x) => `${x.f} ${x.gz}`).join(', ');
const sum = (files: { gz: number }[]) => files.reduce((s, x) => s + x.gz, 0);

describe('shipped JavaScript', () => {
  const scripts = readdirSync(ASSETS).filter((f) => f.endsWith('.js'));
  const sizes = scripts.map((f) => ({ f, gz: gz(f) }));

  it('loads the default run in under 150 kB gzipped: entry, preloaded chunks and the simulation worker', () => {
    const html = readFileSync(join(DIST, 'index.html'), 'utf8');
    const referenced = [...html.matchAll(/(?:src|href)="\.\/assets\/([^"]+\.js)"/g)].map((m) => m[1]);
    const worker = scripts.filter((f) => f.startsWith('simulation.worker'));
    expect(referenced.length, 'index.html names its scripts').toBeGreaterThan(0);
    expect(worker.length, 'the simulation worker is among the assets').toBe(1);
    const first = sizes.filter((x) => referenced.includes(x.f) || worker.includes(x.f));
    expect(sum(first), list(first)).toBeLessThan(FIRST_LOAD_BUDGET);
  });

  it('is under 400 kB gzipped in all, every view and worker included', () => {
    expect(
      scripts.some((f) => f.includes('userData.worker')),
      'the user-file worker is among the assets',
    ).toBe(true);
    expect(sum(sizes), list(sizes)).toBeLessThan(TOTAL_BUDGET);
  });
});
