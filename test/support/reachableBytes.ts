/**
 * Bytes of every typed array reachable from some roots through own properties (each ArrayBuffer
 * counted once), and how many there are: the memory a built object graph really holds in arrays.
 */
export function reachableArrayBytes(...roots: unknown[]): { bytes: number; buffers: number } {
  const seen = new Set<object>();
  const buffers = new Set<ArrayBufferLike>();
  const stack: unknown[] = [...roots];
  while (stack.length) {
    const x = stack.pop();
    if (typeof x !== 'object' || x === null || seen.has(x)) continue;
    seen.add(x);
    if (ArrayBuffer.isView(x)) {
      buffers.add(x.buffer);
      continue;
    }
    if (x instanceof ArrayBuffer) {
      buffers.add(x);
      continue;
    }
    for (const key of Object.getOwnPropertyNames(x)) {
      const d = Object.getOwnPropertyDescriptor(x, key);
      if (d && 'value' in d) stack.push(d.value);
    }
  }
  let bytes = 0;
  for (const b of buffers) bytes += b.byteLength;
  return { bytes, buffers: buffers.size };
}
