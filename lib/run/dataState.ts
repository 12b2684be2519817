import { InputError } from '../inputError';

/**
 * The plain-data state of an accumulator object (the budget series, the Hovmöller record, the time
 * means, the steady criterion): its own fields that are numbers, booleans, texts, null, typed arrays,
 * arrays and plain objects of these. A run is rolled back (a blow-up retry) or resumed (a checkpoint
 * file) by capturing this state at a checkpoint and writing it back later, so the measurement carries
 * on exactly as if the run had never been interrupted.
 *
 * Capture is strict on purpose: a field holding anything else (a class instance such as a plan or a
 * transform) must be named in `skip` by the caller, who thereby says it is configuration, not state.
 * A new state-bearing field of another kind makes capture throw instead of being silently left out.
 * Restore writes typed arrays back into the object's own buffers (views others hold stay valid) and
 * refuses a state whose fields, array types or lengths differ from the object's.
 */
export type TypedArray =
  Float64Array | Float32Array | Int32Array | Uint32Array | Int16Array | Uint16Array | Int8Array | Uint8Array;
export type StateValue =
  number | boolean | string | null | undefined | TypedArray | StateValue[] | { [field: string]: StateValue };
export interface CapturedState {
  [field: string]: StateValue;
}

const TYPED: Record<string, new (n: number) => TypedArray> = {
  Float64Array,
  Float32Array,
  Int32Array,
  Uint32Array,
  Int16Array,
  Uint16Array,
  Int8Array,
  Uint8Array,
};

export function isTypedArray(x: unknown): x is TypedArray {
  return ArrayBuffer.isView(x) && !(x instanceof DataView) && x.constructor.name in TYPED;
}

function isPlainObject(x: unknown): x is Record<string, unknown> {
  if (typeof x !== 'object' || x === null) return false;
  const proto = Object.getPrototypeOf(x);
  return proto === Object.prototype || proto === null;
}

const isPrimitive = (x: unknown) =>
  x === null || x === undefined || typeof x === 'number' || typeof x === 'boolean' || typeof x === 'string';

/**
 * A deep copy of the own fields of `obj` but those in `skip`. Throws an InputError of source 'state'
 * (its field the path of the entry) on non-plain data.
 */
export function captureState(obj: object, skip: readonly string[] = [], path = '(state)'): CapturedState {
  const out: CapturedState = {};
  for (const key of Object.keys(obj)) {
    if (skip.includes(key)) continue;
    out[key] = copyValue((obj as Record<string, unknown>)[key], `${path}.${key}`);
  }
  return out;
}

function copyValue(x: unknown, path: string): StateValue {
  if (isPrimitive(x)) return x as StateValue;
  if (isTypedArray(x)) return x.slice();
  if (Array.isArray(x)) return x.map((e, i) => copyValue(e, `${path}.${i}`));
  if (isPlainObject(x)) return captureState(x, [], path);
  const kind = typeof x === 'object' && x !== null ? (x.constructor?.name ?? 'object') : typeof x;
  throw new InputError(
    'state',
    path,
    `holds a ${kind}, which is not plain data: skip it as configuration or capture it on its own`,
  );
}

/** Write a captured state back into `obj` (the same kind of object it was captured from). */
export function restoreState(obj: object, state: CapturedState, skip: readonly string[] = [], path = '(state)'): void {
  const target = obj as Record<string, unknown>;
  const keys = Object.keys(target).filter((k) => !skip.includes(k));
  const saved = Object.keys(state);
  const missing = keys.filter((k) => !Object.hasOwn(state, k));
  const extra = saved.filter((k) => !keys.includes(k));
  if (missing.length || extra.length) {
    throw new InputError(
      'state',
      path,
      `the state does not fit: ${missing.length ? `it lacks ${missing.join(', ')}` : ''}${missing.length && extra.length ? '; ' : ''}${extra.length ? `it has unknown ${extra.join(', ')}` : ''}`,
    );
  }
  // Check everything before writing anything, so a refused state leaves the object as it was.
  for (const key of keys) checkValue(target[key], state[key], `${path}.${key}`);
  for (const key of keys) target[key] = writeValue(target[key], state[key]);
}

function checkValue(current: unknown, saved: StateValue, path: string): void {
  if (isTypedArray(current)) {
    if (!isTypedArray(saved) || saved.constructor !== current.constructor)
      throw new InputError('state', path, `must be a ${current.constructor.name}`);
    if (saved.length !== current.length)
      throw new InputError('state', path, `holds ${saved.length} values, the object ${current.length}`);
    return;
  }
  if (Array.isArray(current)) {
    if (!Array.isArray(saved)) throw new InputError('state', path, 'must be a list');
    // A list of typed arrays is storage of fixed shape; a list of plain values may change length.
    if (current.some(isTypedArray)) {
      if (saved.length !== current.length)
        throw new InputError('state', path, `holds ${saved.length} entries, the object ${current.length}`);
      current.forEach((c, i) => checkValue(c, saved[i], `${path}.${i}`));
    } else saved.forEach((s, i) => checkPlain(s, `${path}.${i}`));
    return;
  }
  if (isPlainObject(current)) {
    if (!isPlainObject(saved) || Array.isArray(saved)) throw new InputError('state', path, 'must be an object');
    const a = Object.keys(current).sort().join(',');
    const b = Object.keys(saved).sort().join(',');
    if (a !== b) throw new InputError('state', path, `fields ${b} differ from the object's ${a}`);
    for (const k of Object.keys(current)) checkValue(current[k], (saved as CapturedState)[k], `${path}.${k}`);
    return;
  }
  // A scalar field may change kind between captures (a time that is null until first set).
  if (!isPrimitive(saved)) throw new InputError('state', path, 'must be a number, boolean, text or null');
}

function checkPlain(x: StateValue, path: string): void {
  if (isPrimitive(x)) return;
  if (Array.isArray(x)) return x.forEach((e, i) => checkPlain(e, `${path}.${i}`));
  throw new InputError('state', path, 'must be a number, boolean, text or null');
}

function writeValue(current: unknown, saved: StateValue): unknown {
  if (isTypedArray(current)) {
    current.set(saved as TypedArray);
    return current;
  }
  if (Array.isArray(current)) {
    if (current.some(isTypedArray)) {
      current.forEach((c, i) => writeValue(c, (saved as StateValue[])[i]));
      return current;
    }
    return (saved as StateValue[]).map((s) => copyValue(s, ''));
  }
  if (isPlainObject(current)) {
    for (const k of Object.keys(current)) current[k] = writeValue(current[k], (saved as CapturedState)[k]);
    return current;
  }
  return saved;
}

/** Bytes of the typed arrays in a captured state (what a copy of it holds). */
export function stateBytes(state: StateValue): number {
  if (isTypedArray(state)) return state.byteLength;
  if (Array.isArray(state)) return state.reduce<number>((s, x) => s + stateBytes(x), 0);
  if (isPlainObject(state)) return Object.values(state).reduce<number>((s, x) => s + stateBytes(x as StateValue), 0);
  return 0;
}

export const TYPED_ARRAYS = TYPED;
