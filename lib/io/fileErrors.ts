/**
 * Plain words for what goes wrong inside a damaged file. The readers' own checks throw RangeErrors
 * that say what is wrong in the file's terms; the layers below them — jsfive's asserts (often thrown
 * as bare strings), and the JavaScript engine's own TypeErrors and DataView or allocation
 * RangeErrors ("Offset is outside the bounds of the DataView", "thing is not a function", "Invalid
 * typed array length: 17179869184") — speak of the program, not of the file. `fileError` runs a
 * step of reading and turns any of the latter into a RangeError that names the part of the file
 * being read and what that means, keeping the original as its cause.
 */
/** The engine's own RangeErrors (the readers' checks throw RangeErrors too, with other words). */
const ENGINE_RANGE: readonly [RegExp, string][] = [
  [
    /outside the bounds of the DataView|Offset is out of bounds/i,
    'an address or a size in it points past the end of the file',
  ],
  [
    /Invalid (typed )?array length|Array buffer allocation failed|Maximum call stack/i,
    'a size in it is impossibly large',
  ],
];

/** Whether an error comes from below the readers' own checks (and so says nothing a user can act on). */
export function isLowLevel(e: unknown): boolean {
  if (!(e instanceof Error)) return true; // jsfive throws strings
  if (!(e instanceof RangeError)) return true; // TypeError, ReferenceError, …: a fault reading garbage
  return ENGINE_RANGE.some(([re]) => re.test(e.message));
}

/** What a low-level error means for the file, in words; a bare string of jsfive's is quoted as its reason. */
export function meaning(e: unknown): string {
  const text = e instanceof Error ? e.message : String(e);
  for (const [re, words] of ENGINE_RANGE) if (re.test(text)) return words;
  if (e instanceof Error && !(e instanceof RangeError)) return 'its structure is not what the HDF5 format allows';
  const inner = /^\w+\('(.*)'\)$/.exec(text)?.[1] ?? text; // InvalidHDF5File('unknown Data Object Header')
  return `its structure is not what the HDF5 format allows (the HDF5 reader says: ${printable(inner.toLowerCase(), 80)})`;
}

/** Runs a step of reading `where` (e.g. 'the variable "u"'); low-level errors become plain RangeErrors. */
export function fileError<T>(where: string, step: () => T): T {
  try {
    return step();
  } catch (e) {
    if (!isLowLevel(e)) throw e;
    throw new RangeError(`corrupt HDF5 file: ${where} cannot be read: ${meaning(e)}`, { cause: e });
  }
}

/**
 * Text from a file as a message shows it: control characters and undecodable bytes as "?", cut at
 * `max` characters with "…". A damaged file's names and units are often binary garbage.
 */
export function printable(text: string, max = 60): string {
  // eslint-disable-next-line no-control-regex -- the point is to replace control characters
  const clean = text.replace(/[\u0000-\u001f\u007f-\u009f\ufffd]/g, '?');
  return clean.length > max ? `${clean.slice(0, max)}…` : clean;
}
