import { readFileSync } from 'node:fs';

/** Stria's version from package.json, for `--version` and the `source` of the files it writes. */
export function striaVersion(): string {
  const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version?: unknown };
  return typeof pkg.version === 'string' ? pkg.version : '0.0.0';
}
