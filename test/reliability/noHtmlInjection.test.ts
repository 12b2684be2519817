import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

// The app shows what files and links bring (names, attributes, messages) as text only, and runs no
// code made from strings: the Content Security Policy (scripts/contentPolicy.ts) forbids eval in the
// page, and this scan keeps it out of the workers too, which the page's policy does not cover.
// No allow-list: nothing in the code needs any of these.

const ROOT = resolve(import.meta.dirname, '../..');
const SCANNED = ['src', 'workers', 'lib'];
const EXTENSIONS = /\.(ts|js|mjs|svelte)$/;

/** What turns a string into markup or code, each with why it is refused. */
export const FORBIDDEN: readonly { pattern: RegExp; why: string }[] = [
  { pattern: /\{@html\b/, why: 'Svelte {@html} inserts markup' },
  { pattern: /\binnerHTML\b/, why: 'innerHTML parses markup' },
  { pattern: /\bouterHTML\b/, why: 'outerHTML parses markup' },
  { pattern: /\binsertAdjacentHTML\b/, why: 'insertAdjacentHTML parses markup' },
  { pattern: /\bdocument\s*\.\s*write(ln)?\b/, why: 'document.write parses markup' },
  { pattern: /\bcreateContextualFragment\b/, why: 'createContextualFragment parses markup' },
  { pattern: /\bsrcdoc\b/, why: 'srcdoc makes a document from a string' },
  { pattern: /(?<![.\w$])eval\s*\(/, why: 'eval runs a string as code' },
  { pattern: /\bnew\s+Function\b|(?<![.\w$])Function\s*\(/, why: 'Function makes code from a string' },
  { pattern: /\bset(Timeout|Interval)\s*\(\s*['"`]/, why: 'a string timer is eval' },
  { pattern: /javascript:/i, why: 'a javascript: URL runs code' },
];

/** Every forbidden use in a text, as "line: why". */
export function findInjection(text: string): { line: number; why: string }[] {
  const found: { line: number; why: string }[] = [];
  text.split('\n').forEach((l, i) => {
    for (const f of FORBIDDEN) if (f.pattern.test(l)) found.push({ line: i + 1, why: f.why });
  });
  return found;
}

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const path = join(dir, e.name);
    if (e.isDirectory()) return sourceFiles(path);
    return EXTENSIONS.test(e.name) ? [path] : [];
  });
}

describe('no markup or code from strings in the app', () => {
  it('finds each forbidden form in a sample (the scan can fail)', () => {
    const samples = [
      '{@html note}',
      'el.innerHTML = name;',
      'el.outerHTML = x',
      "el.insertAdjacentHTML('beforeend', s)",
      'document.write(s)',
      'document.writeln(s)',
      'range.createContextualFragment(s)',
      '<iframe srcdoc={s}>',
      'eval(code)',
      'const f = new Function("a", body);',
      "Function('return this')()",
      "setTimeout('tick()', 10)",
      '<a href="javascript:void 0">',
    ];
    for (const s of samples) expect(findInjection(s), s).toHaveLength(1);
    // Words that only look alike are not uses.
    for (const s of [
      'retrieval(x)',
      'x.evaluate(y)',
      'typeof f === "function"',
      'setTimeout(() => tick(), 10)',
      'el.textContent = name',
      'myFunction(x)',
    ]) {
      expect(findInjection(s), s).toEqual([]);
    }
  });

  it(`appears nowhere in ${SCANNED.join('/, ')}/`, () => {
    const files = SCANNED.flatMap((d) => sourceFiles(join(ROOT, d)));
    expect(files.length).toBeGreaterThan(100);
    const hits = files.flatMap((f) =>
      findInjection(readFileSync(f, 'utf8')).map((h) => `${relative(ROOT, f)}:${h.line}: ${h.why}`),
    );
    expect(hits).toEqual([]);
  });
});
