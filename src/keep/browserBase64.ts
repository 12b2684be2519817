import type { Base64Codec } from '../../lib/run/stateJson';

/** Bytes per chunk handed to btoa: a multiple of 3, so the chunks' encodings join without padding in between. */
const CHUNK = 3 * 8192;

/**
 * Base64 by the browser's own btoa and atob, for the run files the app keeps: the portable encoder of
 * lib/io/runFile.ts takes about 0.4 s a megabyte on the page's thread, this a small fraction of it.
 * Standard alphabet with padding (RFC 4648 §4), the same text as lib/io's `encodeBase64`
 * (test/src/keep/browserBase64.test.ts).
 */
export const BROWSER_BASE64: Base64Codec = {
  encode(bytes: Uint8Array): string {
    const parts: string[] = [];
    for (let i = 0; i < bytes.length; i += CHUNK) {
      const chunk = bytes.subarray(i, i + CHUNK);
      parts.push(btoa(String.fromCharCode.apply(null, chunk as unknown as number[])));
    }
    return parts.join('');
  },
  decode(text: string): Uint8Array {
    const binary = atob(text);
    const out = new Uint8Array(binary.length);
    for (let i = 0; i < binary.length; i++) out[i] = binary.charCodeAt(i);
    return out;
  },
};
