/**
 * The platform APIs lib/ may use beyond ES2022. tsconfig.lib.json compiles lib/ against ES2022 alone,
 * with no DOM and no Node types, so that nothing browser- or Node-only slips in; these are declared
 * here because every engine Stria runs on has them (Node ≥ 11 as globals, every browser the app
 * supports, and their workers), as the WHATWG Encoding Standard defines them. Only the members lib/
 * uses are declared. tsconfig.json, which has the DOM's and Node's own declarations, leaves this
 * file out.
 */

/** UTF-8 bytes of a string; a lone surrogate becomes U+FFFD (it has no UTF-8 form). */
interface TextEncoder {
  encode(input?: string): Uint8Array;
}
declare var TextEncoder: {
  prototype: TextEncoder;
  new (): TextEncoder;
};

/**
 * Text from bytes (UTF-8 unless another label is given). Malformed bytes become U+FFFD, or throw a
 * TypeError with `fatal`; a leading byte-order mark is dropped unless `ignoreBOM` keeps it.
 */
interface TextDecoder {
  decode(input?: Uint8Array): string;
}
declare var TextDecoder: {
  prototype: TextDecoder;
  new (label?: string, options?: { fatal?: boolean; ignoreBOM?: boolean }): TextDecoder;
};
