import { existsSync, realpathSync, statSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { UsageError } from './args';

/**
 * The one check every command that writes makes before it writes anything: its outputs are files
 * (or folders) of their own, none is also an input, each can be created where it is asked for, and
 * none already exists unless the command says what to do with it. A refusal is a UsageError that
 * names the option and the path and says what to do instead, so nothing a user made earlier is ever
 * replaced unasked, and no raw ENOENT or EISDIR reaches the user.
 *
 * "The same file" is decided by what the paths lead to, not by how they are written: `a/../x.nc`,
 * a symbolic link and a hard link to an existing file are all that file.
 */
export interface OutputPath {
  /** The option that names it, e.g. "--zonal". */
  option: string;
  path: string;
  kind: 'file' | 'folder';
  /** It may exist: the command continues it (a resumed run's own files). */
  continues?: boolean;
}

export interface InputPath {
  /** The option, or the positional's name (e.g. "FILE"). */
  option: string;
  path: string;
  /** Outputs that may be this very file (a checkpoint resumed and rewritten in place). */
  sharedWith?: readonly string[];
}

export interface GuardOptions {
  /** The user asked to replace what exists (--overwrite). */
  overwrite: boolean;
  /** What to say to a user whose output exists: the choices, e.g. "--overwrite to start afresh over it". */
  choices: string;
}

export function guardOutputs(outputs: readonly OutputPath[], inputs: readonly InputPath[], o: GuardOptions): void {
  const ids = outputs.map((out) => identity(out.path));
  for (let i = 0; i < outputs.length; i++)
    for (let j = i + 1; j < outputs.length; j++)
      if (ids[i] === ids[j])
        throw new UsageError(
          `${outputs[i].option} and ${outputs[j].option} name the same file, ${outputs[j].path}: give each output a file of its own`,
        );
  for (const input of inputs) {
    const id = identity(input.path);
    outputs.forEach((out, i) => {
      if (ids[i] === id && !input.sharedWith?.includes(out.option))
        throw new UsageError(
          `${out.option} ${out.path} is also the file this command reads (${input.option}): give the output another name`,
        );
    });
  }
  for (const out of outputs) checkPlace(out, o);
}

/** The folder exists, the path is of the right kind, and an existing output is replaced only when asked. */
function checkPlace(out: OutputPath, o: GuardOptions): void {
  const at = `${out.option} ${out.path}`;
  if (out.kind === 'file') {
    const folder = dirname(resolve(out.path));
    if (!existsSync(folder))
      throw new UsageError(`${at}: the folder ${dirname(out.path)} does not exist; create it first`);
    if (!statSync(folder).isDirectory()) throw new UsageError(`${at}: ${dirname(out.path)} is a file, not a folder`);
  }
  if (!existsSync(out.path)) return;
  const isFolder = statSync(out.path).isDirectory();
  if (out.kind === 'file' && isFolder) throw new UsageError(`${at} is a folder; give a file name`);
  if (out.kind === 'folder' && !isFolder) throw new UsageError(`${at} is a file, not a folder`);
  if (out.kind === 'file' && !out.continues && !o.overwrite)
    throw new UsageError(`${at} already exists: give ${o.choices}; nothing was written`);
}

/**
 * What a path leads to: device and inode of an existing file (links and every spelling of the path
 * agree), else the real path of its folder joined with its name.
 */
export function identity(path: string): string {
  const full = resolve(path);
  if (existsSync(full)) {
    const s = statSync(full);
    return `inode ${s.dev}:${s.ino}`;
  }
  const folder = dirname(full);
  return `path ${join(existsSync(folder) ? realpathSync(folder) : folder, basename(full))}`;
}
