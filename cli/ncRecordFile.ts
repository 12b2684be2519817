import { closeSync, fstatSync, fsyncSync, ftruncateSync, openSync, readSync, writeSync } from 'node:fs';
import type { StriaRunInfo } from '../lib/io/cfGlobalAttributes';
import type { StriaFileKindSpec } from '../lib/io/cfStria';
import { StriaFileWriter, type StriaFrame } from '../lib/io/cfStriaWriter';
import { decodeSlab, readNetcdf, type NcReadVariable } from '../lib/io/netcdfRead';

/**
 * A Stria NetCDF file on disk that grows one record at a time (lib/io/cfStriaWriter.ts): the header
 * goes out when it is opened, each frame is written at its record's offset and then the record count
 * at byte 4 is updated, so after every frame the file is a complete, readable NetCDF file. A long
 * run's output can be opened (ncdump, xarray) while the run goes on, and a killed run keeps every
 * record written before the kill: a record cut short lies past the count, where readers never look.
 *
 * `NcRecordFile.continue` reopens such a file to go on from its first `keep` records (a resumed run,
 * or a run rolled back to a checkpoint): the header must be the one this run writes, byte for byte,
 * and each kept record is read back and passed through a fresh writer, which checks it as it checks
 * any frame (times strictly increasing, whole step counts) and must give back the very same bytes,
 * so the writer's count and time order carry on. The values themselves are taken as they are (the
 * checkpoint's digest does not cover the NetCDF files). What lies after the kept records is cut off.
 */
export class NcRecordFile {
  readonly path: string;
  private writer: StriaFileWriter;
  private fd: number | null;

  constructor(path: string, kind: StriaFileKindSpec, run: StriaRunInfo) {
    this.path = path;
    this.writer = new StriaFileWriter(kind, run);
    this.fd = openSync(path, 'w+'); // read too: a rollback reads the kept records back
    const head = this.writer.head();
    writeSync(this.fd, head, 0, head.length, 0);
  }

  /** Reopen `path` keeping its first `keep` records; throws naming the file when it cannot be continued. */
  static continue(path: string, kind: StriaFileKindSpec, run: StriaRunInfo, keep: number): NcRecordFile {
    const file = Object.create(NcRecordFile.prototype) as NcRecordFile;
    (file as { path: string }).path = path;
    let fd: number;
    try {
      fd = openSync(path, 'r+');
    } catch (e) {
      throw new Error(`cannot continue ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`, {
        cause: e,
      });
    }
    try {
      file.writer = adoptRecords(fd, path, kind, run, keep);
    } catch (e) {
      closeSync(fd);
      throw e;
    }
    file.fd = fd;
    return file;
  }

  get records(): number {
    return this.writer.numrecs;
  }

  append(frame: StriaFrame): void {
    if (this.fd === null) throw new Error(`${this.path} is closed`);
    const r = this.writer.numrecs;
    const bytes = this.writer.appendFrame(frame);
    writeSync(this.fd, bytes, 0, bytes.length, this.writer.recordOffset(r));
    // The count last: a reader never sees a record that is not all there.
    const count = this.writer.numrecsField();
    writeSync(this.fd, count, 0, count.length, StriaFileWriter.NUMRECS_OFFSET);
  }

  /** Go back to the first `keep` records (a retry from a checkpoint taken when there were that many). */
  rollBack(keep: number, kind: StriaFileKindSpec, run: StriaRunInfo): void {
    if (this.fd === null) throw new Error(`${this.path} is closed`);
    this.writer = adoptRecords(this.fd, this.path, kind, run, keep);
  }

  /** Flush what is written to the disk (before a checkpoint that counts these records is written). */
  sync(): void {
    if (this.fd !== null) fsyncSync(this.fd);
  }

  close(): void {
    if (this.fd !== null) closeSync(this.fd);
    this.fd = null;
  }
}

/** A writer positioned after the first `keep` records of the open file `fd`, checked and cut there. */
function adoptRecords(
  fd: number,
  path: string,
  kind: StriaFileKindSpec,
  run: StriaRunInfo,
  keep: number,
): StriaFileWriter {
  const writer = new StriaFileWriter(kind, run);
  const head = writer.head();
  const size = fstatSync(fd).size;
  const onDisk = new Uint8Array(head.length);
  if (size < head.length || readSync(fd, onDisk, 0, head.length, 0) !== head.length)
    throw new Error(`cannot continue ${path}: it is shorter than its header`);
  const count = new DataView(onDisk.buffer).getUint32(StriaFileWriter.NUMRECS_OFFSET, false);
  // The header but its record count must be the one this run writes (same run, grid and version).
  for (let i = 0; i < head.length; i++) {
    if (i >= StriaFileWriter.NUMRECS_OFFSET && i < StriaFileWriter.NUMRECS_OFFSET + 4) continue;
    if (head[i] !== onDisk[i])
      throw new Error(
        `cannot continue ${path}: its header differs from the one this run writes (another run, grid or Stria version wrote it)`,
      );
  }
  if (count < keep)
    throw new Error(
      `cannot continue ${path}: it holds ${count} records, but ${keep} were written before the checkpoint`,
    );
  const layout = readNetcdf(head, { headerOnly: true });
  const start = writer.recordOffset(0);
  const vars = layout.variables.filter((v) => v.isRecord);
  const slab = (v: NcReadVariable, rec: Uint8Array) =>
    decodeSlab(v.type, rec.subarray(v.begin - start, v.begin - start + v.slabCount * sizeOf(v)));
  const rec = new Uint8Array(writer.recordSize);
  for (let r = 0; r < keep; r++) {
    const offset = writer.recordOffset(r);
    if (readSync(fd, rec, 0, rec.length, offset) !== rec.length)
      throw new Error(`cannot continue ${path}: record ${r} is cut short`);
    const fields: Record<string, ArrayLike<number>> = {};
    let time = NaN;
    let steps = NaN;
    for (const v of vars) {
      const values = slab(v, rec);
      if (v.name === 'time') time = values[0];
      else if (v.name === 'step') steps = values[0];
      else fields[v.name] = values;
    }
    let again: Uint8Array;
    try {
      again = writer.appendFrame({ time, steps, fields });
    } catch (e) {
      throw new Error(`cannot continue ${path}: record ${r}: ${(e as Error).message}`, { cause: e });
    }
    for (let i = 0; i < rec.length; i++)
      if (again[i] !== rec[i]) throw new Error(`cannot continue ${path}: record ${r} is not what this run writes`);
  }
  // The count first, then the cut: killed in between, the file holds extra bytes past its count,
  // which readers ignore, never a count past its end.
  const field = writer.numrecsField();
  writeSync(fd, field, 0, field.length, StriaFileWriter.NUMRECS_OFFSET);
  ftruncateSync(fd, writer.recordOffset(keep));
  return writer;
}

function sizeOf(v: NcReadVariable): number {
  return { byte: 1, char: 1, short: 2, int: 4, float: 4, double: 8 }[v.type];
}
