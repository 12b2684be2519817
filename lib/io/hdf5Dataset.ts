import { Dataset, File, Group, type DataObjects } from 'jsfive';
import type { AllocationMeter } from './allocationMeter';
import type { ByteSource } from './byteSource';
import type { AttributeValue, DatasetDimension, DatasetReader, ReadOptions, ReaderOptions } from './datasetReader';
import { isNumericType, NamedVariables, readBuffer, recordRange } from './datasetReader';
import { readChunkIndex } from './hdf5ChunkIndex';
import { denseAttributes } from './hdf5DenseAttributes';
import { elementReader, elementType, parseDataspace, parseLayout, superblockEnd, superblockSizes } from './hdf5Format';
import { checkFilters, describe, readSlab, type SlabPlan } from './hdf5Slab';
import { cleanAttributes, quietly } from './hdf5Attributes';
import { fileError, printable } from './fileErrors';
import { netcdf4Structure, type Entry } from './hdf5Netcdf4';

/**
 * netCDF-4 files (HDF5 underneath) behind the DatasetReader interface. jsfive parses the superblock,
 * groups, links, datatypes and header attributes; Stria adds what jsfive 0.4.2 lacks: dense attribute
 * storage (hdf5DenseAttributes.ts), the netCDF-4 dimensions (HDF5 dimension scales named by each
 * variable's DIMENSION_LIST), unlimited dimensions (dataspace maximum sizes) and reading one record
 * through the chunk index instead of jsfive's whole-dataset read (hdf5Slab.ts).
 *
 * Memory: HDF5 metadata may lie anywhere in a file and jsfive reads from one ArrayBuffer, so the whole
 * file is in memory (`ByteSource.whole`); reading a record adds the record's float64 values and, per
 * compressed chunk, its stored bytes and decoded bytes, dropped after use. Only the root group is
 * read (netCDF-4 subgroups are listed in `notes`).
 */
export function openHdf5(source: ByteSource, options: ReaderOptions = {}): DatasetReader {
  const buffer = source.whole();
  const view = new DataView(buffer);
  const { end } = fileError('the superblock', () => superblockEnd(view));
  if (end > buffer.byteLength)
    throw new RangeError(
      `truncated HDF5 file: its superblock says the file is ${end} bytes long, but it has ${buffer.byteLength}`,
    );
  const sizes = fileError('the superblock', () => superblockSizes(view));
  if (sizes.offsets !== 8 || sizes.lengths !== 8)
    throw new RangeError(
      `HDF5 files with ${sizes.offsets}-byte offsets are not supported (jsfive reads 8-byte offsets only)`,
    );
  return new Hdf5Dataset(view, options.meter);
}

class Hdf5Dataset extends NamedVariables implements DatasetReader {
  readonly format = 'netcdf4' as const;
  readonly dimensions: DatasetDimension[] = [];
  readonly attributes: Record<string, AttributeValue>;
  readonly notes: string[] = [];
  private readonly objects = new Map<string, DataObjects>();
  private readonly plans = new Map<string, SlabPlan>();

  constructor(
    private readonly view: DataView,
    private readonly meter?: AllocationMeter,
  ) {
    super();
    const warnings: string[] = [];
    const { file, entries, globals } = quietly(warnings, () => {
      let file: File;
      try {
        file = new File(view.buffer as ArrayBuffer);
      } catch (e) {
        throw new RangeError(`cannot read this HDF5 file: ${describe(e)}`, { cause: e });
      }
      const entries: Entry[] = [];
      for (const key of file.keys) {
        let obj: Group | Dataset | null;
        try {
          obj = file.get(key);
        } catch (e) {
          throw new RangeError(`cannot read "${printable(key)}" of this HDF5 file: ${describe(e)}`, { cause: e });
        }
        fileError(`the object "${printable(key)}"`, () => this.addEntry(key, obj, entries));
      }
      const globals = {
        ...safeAttributes(file._dataobjects, 'the file', this.notes),
        ...denseAttributes(file._dataobjects, 'the file'),
      };
      // jsfive lists links in storage order (by name hash or, for dense groups, a string sort of
      // creation indices); the netCDF library creates variables in varid order and HDF5 places each
      // new object header after the last, so header addresses give the file's variable order.
      entries.sort((a, b) => a.obj.offset - b.obj.offset);
      return { file, entries, globals };
    });
    this.attributes = cleanAttributes(globals);
    for (const w of warnings) if (!/REFERENCE_LIST/.test(w)) this.notes.push(`jsfive: ${printable(w, 200)}`);
    const { dimensions, variables, notes } = fileError('the netCDF-4 dimensions', () =>
      netcdf4Structure(file._links, entries),
    );
    this.dimensions.push(...dimensions);
    this.notes.push(...notes);
    for (const { variable, obj } of variables) {
      this.addVariable(variable);
      this.objects.set(variable.name, obj);
    }
  }

  /** One root object: a variable's dataset (its dataspace and attributes), or a note on what else it is. */
  private addEntry(key: string, obj: Group | Dataset | null, entries: Entry[]): void {
    if (obj instanceof Dataset) {
      const d = obj._dataobjects;
      const space = d.find_msg_type(0x0001)[0];
      const { dims, unlimited } = parseDataspace(this.view, space.get('offset_to_message') as number);
      entries.push({
        name: key,
        obj: d,
        attrs: {
          ...safeAttributes(d, `"${printable(key)}"`, this.notes),
          ...denseAttributes(d, `"${printable(key)}"`),
        },
        dims,
        unlimited,
      });
    } else if (obj instanceof Group) {
      // A named data type (a netCDF-4 user-defined type: compound, enum, …) holds a datatype
      // message and no group structure (symbol table 0x0011, link info 0x0002); it is not data.
      const d = obj._dataobjects;
      const namedType =
        d.find_msg_type(0x0003).length > 0 &&
        d.find_msg_type(0x0011).length === 0 &&
        d.find_msg_type(0x0002).length === 0;
      this.notes.push(
        namedType
          ? `"${printable(key)}" is a named data type (a netCDF-4 user-defined type), not a variable: not read`
          : `the group "${printable(key)}" was not read: only the root group of a netCDF-4 file is`,
      );
    }
  }

  readRecord(name: string, index: number, options: ReadOptions = {}): Float64Array {
    const plan = this.plan(name);
    const count = this.recordCount(name);
    if (!(Number.isInteger(index) && index >= 0 && index < count))
      throw new RangeError(`record ${index} of "${name}" does not exist (it has ${count})`);
    const n = this.recordLength(name);
    const range = recordRange(name, n, options.range);
    const out = options.out ?? readBuffer(name, range.count);
    if (out.length !== range.count)
      throw new RangeError(`readRecord("${name}"): out has ${out.length} values, the read ${range.count}`);
    const bytes = (k: number) => k * plan.elementSize;
    fileError(`record ${index} of "${name}"`, () =>
      readSlab(
        this.view,
        plan,
        index,
        out,
        this.meter,
        (done, total) =>
          options.onProgress?.({ variable: name, record: index, done: bytes(done), total: bytes(total) }),
        range.start,
      ),
    );
    return out;
  }

  recordReadBytes(name: string): number {
    const plan = this.plan(name);
    if (plan.layout.kind !== 'chunked' || plan.filters.length === 0) return 0; // read from the file's bytes
    // One chunk at a time: its stored copy and each filter's output, at most the decoded size each.
    const chunk = plan.layout.chunk.reduce((a, b) => a * b, 1) * plan.elementSize;
    return (plan.filters.length + 1) * chunk;
  }

  readAll(name: string, options: ReadOptions = {}): Float64Array {
    const v = this.variable(name);
    const total = v.shape.reduce((a, b) => a * b, 1);
    const out = options.out ?? readBuffer(name, total);
    if (out.length !== total)
      throw new RangeError(`readAll("${name}"): out has ${out.length} values, the variable ${total}`);
    const per = this.recordLength(name);
    for (let r = 0; r < this.recordCount(name) && total > 0; r++)
      this.readRecord(name, r, { out: out.subarray(r * per, (r + 1) * per), onProgress: options.onProgress });
    return out;
  }

  /** Layout, chunk index, filters and element decoder of a variable, built on first read. */
  private plan(name: string): SlabPlan {
    const cached = this.plans.get(name);
    if (cached) return cached;
    return fileError(`the storage of "${name}"`, () => this.newPlan(name));
  }

  private newPlan(name: string): SlabPlan {
    const v = this.variable(name);
    if (!isNumericType(v.type))
      throw new RangeError(
        `"${name}" holds ${v.type === 'char' || v.type === 'string' ? 'text' : 'values of a type Stria does not read'}, not numbers`,
      );
    const obj = this.objects.get(name) as DataObjects;
    const { size, littleEndian } = elementType(obj.dtype);
    const layoutMsg = obj.find_msg_type(0x0008)[0];
    if (!layoutMsg) throw new RangeError(`corrupt HDF5 file: "${name}" has no data layout message`);
    const layout = parseLayout(this.view, layoutMsg.get('offset_to_message') as number, v.shape.length, name);
    const filters = (quietly([], () => obj.filter_pipeline) ?? []).map((f) => ({
      id: Number(f.get('filter_id')),
      clientData: f.get('client_data'),
    }));
    checkFilters(name, filters);
    const chunks = layout.kind === 'chunked' ? readChunkIndex(this.view, layout.btree, v.shape.length, name) : [];
    this.meter?.external(chunks.length * 64, 'chunk index');
    const plan: SlabPlan = {
      variable: name,
      shape: v.shape.slice(),
      layout,
      chunks,
      filters,
      elementSize: size,
      read: elementReader(v.type, littleEndian),
    };
    this.plans.set(name, plan);
    return plan;
  }
}

/**
 * The attributes jsfive decodes, and a note naming each one it cannot (a compound or other type it
 * lacks), with its owner: "the attribute "meta" of "u" …", one note per attribute and variable.
 */
function safeAttributes(obj: DataObjects, owner: string, notes: string[]): Record<string, unknown> {
  const warnings: string[] = [];
  try {
    return quietly(warnings, () => obj.get_attributes());
  } catch (e) {
    throw new RangeError(`cannot read the attributes of ${owner}: ${describe(e)}`, { cause: e });
  } finally {
    for (const w of warnings) {
      const m = /^Attribute (.+) type not implemented, set to null\.?$/.exec(w);
      if (m?.[1] === 'REFERENCE_LIST') continue; // the netCDF-4 bookkeeping of every dimension scale
      notes.push(
        m
          ? `the attribute "${m[1]}" of ${owner} has a type the HDF5 reader cannot decode (such as a compound type): left out`
          : `jsfive, reading the attributes of ${owner}: ${w}`,
      );
    }
  }
}
