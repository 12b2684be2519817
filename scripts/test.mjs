#!/usr/bin/env node
// `npm test`: every check the project has, in order, stopping at the first failure.
//   1. Chromium for the browser tests (installed from Debian when we are root)
//   2. format and lint: Prettier's check, then ESLint with the layering rules (eslint.config.js)
//   3. types: tsc on the core and on everything, then svelte-check, with no errors or warnings
//   4. unit and property tests (vitest, test/)
//   5. build the app, then the browser tests against it (vitest, e2e/)
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const bin = (name) => join(root, 'node_modules', '.bin', name);
const CHROMIUM = '/usr/bin/chromium';
const started = Date.now();
const STAGES = 5;

/** Run a command in the repo root with inherited output; false when it fails. */
function run(cmd, args, env = {}) {
  const r = spawnSync(cmd, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
  if (r.error) console.error(`could not run ${cmd}: ${r.error.message}`);
  return r.status === 0;
}

function stage(n, title, body) {
  console.log(`\n── ${n}/${STAGES} ${title} ${'─'.repeat(Math.max(0, 60 - title.length))}`);
  const t = Date.now();
  if (!body()) {
    console.error(`\n✗ ${title} failed (stage ${n}/${STAGES}); stopping.`);
    process.exit(1);
  }
  console.log(`✓ ${title} (${((Date.now() - t) / 1000).toFixed(1)} s)`);
}

function ensureChromium() {
  if (existsSync(CHROMIUM)) {
    console.log(`${CHROMIUM} found`);
    return true;
  }
  if (process.getuid?.() !== 0) {
    console.error(`${CHROMIUM} is missing. Install it with:\n\n    sudo apt-get install -y chromium\n`);
    return false;
  }
  console.log(`${CHROMIUM} missing; installing Debian's chromium (running as root)`);
  const env = { DEBIAN_FRONTEND: 'noninteractive' };
  return run('apt-get', ['update'], env) && run('apt-get', ['install', '-y', 'chromium'], env) && existsSync(CHROMIUM);
}

stage(1, 'Chromium', ensureChromium);
stage(
  2,
  'format + lint',
  () => run(bin('prettier'), ['--check', '--log-level', 'warn', '.']) && run(bin('eslint'), ['.']),
);
stage(3, 'typecheck', () => run('npm', ['run', '--silent', 'typecheck']));
stage(4, 'unit tests', () => run(bin('vitest'), ['run']));
stage(
  5,
  'build + browser tests',
  () =>
    run(bin('vite'), ['build', '--logLevel', 'warn']) &&
    run(bin('vitest'), ['run', '--config', 'vitest.e2e.config.ts']),
);
console.log(`\nall checks passed in ${((Date.now() - started) / 1000).toFixed(1)} s`);
