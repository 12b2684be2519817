import { basename } from 'node:path';
import type { OptionSpec } from './args';

/**
 * The command line as a file's `history` attribute records it: the command and every option, with
 * each file or directory named by its last component only. A history travels with the file to other
 * people and machines; the directories of the machine that wrote it say where someone's files lie
 * and nothing about how the data were made. Positionals are files (FILE, SPEC); option values are
 * files when the option's value is FILE or DIR. `--name=value` is kept in that form.
 */
export function historyCommand(name: string, words: readonly string[], options: readonly OptionSpec[]): string {
  const isPath = new Set(options.filter((o) => o.value === 'FILE' || o.value === 'DIR').map((o) => `--${o.name}`));
  const valued = new Set(options.filter((o) => o.kind !== 'flag').map((o) => `--${o.name}`));
  const out = ['stria', name];
  let afterEnd = false;
  for (let i = 0; i < words.length; i++) {
    const w = words[i];
    if (afterEnd || !w.startsWith('-') || w === '-') {
      out.push(afterEnd || !w.startsWith('-') ? strip(w) : w);
      continue;
    }
    if (w === '--') {
      afterEnd = true;
      out.push(w);
      continue;
    }
    const eq = w.indexOf('=');
    if (eq > 0) {
      const option = w.slice(0, eq);
      out.push(isPath.has(option) ? `${option}=${strip(w.slice(eq + 1))}` : w);
      continue;
    }
    out.push(w);
    if (valued.has(w) && i + 1 < words.length) {
      i++;
      out.push(isPath.has(w) ? strip(words[i]) : words[i]);
    }
  }
  return out.join(' ');
}

/** The last component of a path ('' stays ''), on either separator. */
function strip(path: string): string {
  return path === '' ? path : basename(path.replace(/\\/g, '/'));
}
