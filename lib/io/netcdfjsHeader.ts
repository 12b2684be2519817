/**
 * What netcdfjs 4 gives for a header, made faithful. It reads names and text one signed byte per
 * UTF-16 code unit (a byte b ≥ 0x80 becomes U+FF00 + b), so UTF-8 names and text come out garbled,
 * and it reads byte attributes unsigned and always as arrays. The NetCDF classic format
 * specification stores names as UTF-8 and reads bytes as signed by default; this undoes both.
 */
export type NcAttributeValue = string | number | number[];

export interface RawAttribute {
  name: string;
  type: string;
  value: string | number | number[];
}

/** netcdfjs reads names and text one signed byte per UTF-16 unit; undo that to recover UTF-8. */
export function utf8FromNetcdfjs(s: string): string {
  let ascii = true;
  for (let i = 0; i < s.length && ascii; i++) ascii = s.charCodeAt(i) < 0x80;
  if (ascii) return s;
  const b = new Uint8Array(s.length);
  for (let i = 0; i < s.length; i++) b[i] = s.charCodeAt(i) & 0xff;
  return new TextDecoder('utf-8', { ignoreBOM: true }).decode(b);
}

/** Text as strings, one number as a number, several as an array; byte read as signed (the spec's default). */
export function attributesOf(list: readonly RawAttribute[]): Record<string, NcAttributeValue> {
  const out: Record<string, NcAttributeValue> = {};
  for (const a of list ?? []) {
    let value = a.value;
    if (a.type === 'char') value = utf8FromNetcdfjs(value as string);
    else if (a.type === 'byte') {
      const signed = (value as number[]).map((x) => (x << 24) >> 24);
      value = signed.length === 1 ? signed[0] : signed;
    }
    Object.defineProperty(out, utf8FromNetcdfjs(a.name), {
      value,
      enumerable: true,
      writable: true,
      configurable: true,
    });
  }
  return out;
}
