import { decodeBase64, encodeBase64 } from '../io/base64';
import { InputError } from '../inputError';
import { isTypedArray, TYPED_ARRAYS, type StateValue, type TypedArray } from './dataState';

/**
 * A captured state (dataState.ts) as JSON, exactly: JSON has no NaN, ±Infinity or −0, and a time
 * mean must come back to the same bits, so such numbers are tagged, { "$n": "NaN" | "Infinity" |
 * "-Infinity" | "-0" }; typed arrays are their raw bytes in base64, { "$a": "Float64Array", "b64": … }
 * (little-endian, the byte order of every platform Stria runs on); undefined is { "$u": 1 }.
 */

const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

export function stateToJson(x: StateValue): unknown {
  if (x === undefined) return { $u: 1 };
  if (typeof x === 'number') {
    if (Number.isNaN(x)) return { $n: 'NaN' };
    if (x === Infinity) return { $n: 'Infinity' };
    if (x === -Infinity) return { $n: '-Infinity' };
    if (Object.is(x, -0)) return { $n: '-0' };
    return x;
  }
  if (x === null || typeof x === 'boolean' || typeof x === 'string') return x;
  if (isTypedArray(x)) {
    if (!LITTLE_ENDIAN)
      throw new RangeError('stateToJson: typed arrays are stored little-endian; this platform is big-endian');
    return { $a: x.constructor.name, b64: encodeBase64(new Uint8Array(x.buffer, x.byteOffset, x.byteLength)) };
  }
  if (Array.isArray(x)) return x.map((e) => stateToJson(e));
  return Object.fromEntries(Object.entries(x).map(([k, v]) => [k, stateToJson(v)]));
}

const NUMBERS: Record<string, number> = { NaN: NaN, Infinity: Infinity, '-Infinity': -Infinity, '-0': -0 };

/** The state back from its JSON; throws an InputError of source 'state' naming the path of a malformed entry. */
export function stateFromJson(j: unknown, path = '(state)'): StateValue {
  if (j === null || typeof j === 'boolean' || typeof j === 'string') return j;
  if (typeof j === 'number') {
    if (!Number.isFinite(j)) throw new InputError('state', path, 'is not a JSON number');
    return j;
  }
  if (Array.isArray(j)) return j.map((e, i) => stateFromJson(e, `${path}.${i}`));
  if (typeof j !== 'object') throw new InputError('state', path, `is a ${typeof j}, not state data`);
  const o = j as Record<string, unknown>;
  const keys = Object.keys(o);
  if (keys.length === 1 && keys[0] === '$u' && o.$u === 1) return undefined;
  if (keys.length === 1 && keys[0] === '$n') {
    if (typeof o.$n !== 'string' || !Object.hasOwn(NUMBERS, o.$n))
      throw new InputError('state', path, `"$n" must be one of ${Object.keys(NUMBERS).join(', ')}`);
    return NUMBERS[o.$n];
  }
  if (keys.length === 2 && '$a' in o && 'b64' in o) return typedFromJson(o.$a, o.b64, path);
  const out: Record<string, StateValue> = {};
  for (const k of keys) {
    if (k.startsWith('$'))
      throw new InputError('state', `${path}.${k}`, 'is not a state field (tags are $n, $a with b64, $u)');
    out[k] = stateFromJson(o[k], `${path}.${k}`);
  }
  return out;
}

function typedFromJson(kind: unknown, b64: unknown, path: string): TypedArray {
  if (typeof kind !== 'string' || !Object.hasOwn(TYPED_ARRAYS, kind))
    throw new InputError('state', path, `"$a" must name a typed array (${Object.keys(TYPED_ARRAYS).join(', ')})`);
  const malformed = () => new InputError('state', path, '"b64" must be padded standard base64');
  if (typeof b64 !== 'string' || b64.length % 4 !== 0) throw malformed();
  if (!LITTLE_ENDIAN)
    throw new RangeError('stateFromJson: typed arrays are stored little-endian; this platform is big-endian');
  // The decoder checks the alphabet as it decodes (one pass over megabytes, not three).
  let bytes: Uint8Array;
  try {
    bytes = decodeBase64(b64);
  } catch {
    throw malformed();
  }
  const Ctor = TYPED_ARRAYS[kind];
  const size = (Ctor as unknown as { BYTES_PER_ELEMENT: number }).BYTES_PER_ELEMENT;
  if (bytes.byteLength % size !== 0)
    throw new InputError('state', path, `${bytes.byteLength} bytes is not a whole number of ${kind} values`);
  const out = new Ctor(bytes.byteLength / size);
  new Uint8Array(out.buffer).set(bytes);
  return out;
}
