import { closeSync, openSync, writeSync } from 'node:fs';
import type { StriaRunInfo } from '../lib/io/cfGlobalAttributes';
import type { StriaFileKindSpec } from '../lib/io/cfStria';
import { StriaFileWriter, type StriaFrame } from '../lib/io/cfStriaWriter';

/**
 * A Stria NetCDF file on disk that grows one record at a time (lib/io/cfStriaWriter.ts): the header
 * goes out when it is opened, each frame is written at its record's offset and then the record count
 * at byte 4 is updated, so after every frame the file is a complete, readable NetCDF file. A long
 * run's output can be opened (ncdump, xarray) while the run goes on, and a killed run keeps every
 * record written before the kill.
 */
export class NcRecordFile {
  readonly path: string;
  private readonly writer: StriaFileWriter;
  private fd: number | null;

  constructor(path: string, kind: StriaFileKindSpec, run: StriaRunInfo) {
    this.path = path;
    this.writer = new StriaFileWriter(kind, run);
    this.fd = openSync(path, 'w');
    const head = this.writer.head();
    writeSync(this.fd, head, 0, head.length, 0);
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

  close(): void {
    if (this.fd !== null) closeSync(this.fd);
    this.fd = null;
  }
}
