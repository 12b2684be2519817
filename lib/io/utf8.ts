/**
 * UTF-8 encoding and decoding in plain TypeScript. lib/ is compiled against ES2022 alone, which has
 * no TextEncoder, and NetCDF names and text must be UTF-8 (NetCDF classic format specification,
 * "Note on names"), so the few lines are kept here.
 */

/** UTF-8 bytes of s. Throws on a lone surrogate, which has no UTF-8 form. */
export function utf8Encode(s: string): Uint8Array {
  const out = new Uint8Array(utf8Length(s));
  let k = 0;
  for (let i = 0; i < s.length; i++) {
    let c = s.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff) {
      c = 0x10000 + ((c - 0xd800) << 10) + (s.charCodeAt(++i) - 0xdc00);
    }
    if (c < 0x80) out[k++] = c;
    else if (c < 0x800) {
      out[k++] = 0xc0 | (c >> 6);
      out[k++] = 0x80 | (c & 0x3f);
    } else if (c < 0x10000) {
      out[k++] = 0xe0 | (c >> 12);
      out[k++] = 0x80 | ((c >> 6) & 0x3f);
      out[k++] = 0x80 | (c & 0x3f);
    } else {
      out[k++] = 0xf0 | (c >> 18);
      out[k++] = 0x80 | ((c >> 12) & 0x3f);
      out[k++] = 0x80 | ((c >> 6) & 0x3f);
      out[k++] = 0x80 | (c & 0x3f);
    }
  }
  return out;
}

/** Number of UTF-8 bytes of s; throws on a lone surrogate. */
export function utf8Length(s: string): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff) {
      const d = s.charCodeAt(i + 1);
      if (!(d >= 0xdc00 && d <= 0xdfff)) throw new RangeError(`lone surrogate at position ${i}: not encodable as UTF-8`);
      n += 4;
      i++;
    } else if (c >= 0xdc00 && c <= 0xdfff) throw new RangeError(`lone surrogate at position ${i}: not encodable as UTF-8`);
    else n += 3;
  }
  return n;
}

/** Decodes UTF-8 bytes; malformed sequences become U+FFFD rather than failing. */
export function utf8Decode(bytes: ArrayLike<number>): string {
  let s = '';
  for (let i = 0; i < bytes.length; ) {
    const b = bytes[i];
    let c = 0xfffd;
    let len = 1;
    if (b < 0x80) c = b;
    else if (b >= 0xc2 && b < 0xe0) len = 2;
    else if (b >= 0xe0 && b < 0xf0) len = 3;
    else if (b >= 0xf0 && b < 0xf5) len = 4;
    if (len > 1) {
      let v = b & (0xff >> (len + 1));
      let ok = i + len <= bytes.length;
      for (let k = 1; ok && k < len; k++) {
        const t = bytes[i + k];
        ok = (t & 0xc0) === 0x80;
        v = (v << 6) | (t & 0x3f);
      }
      const min = len === 2 ? 0x80 : len === 3 ? 0x800 : 0x10000;
      if (ok && v >= min && v <= 0x10ffff && !(v >= 0xd800 && v <= 0xdfff)) c = v;
      else len = 1;
    }
    s += String.fromCodePoint(c);
    i += len;
  }
  return s;
}
