/**
 * NetCDF name rules (NetCDF classic format specification, grammar for `name` and "Note on names"):
 * the first character is an ASCII letter or digit, '_' or a multibyte UTF-8 character; the others
 * may also be printing ASCII except '/'; no control characters (0x00–0x1F, 0x7F); no trailing
 * space; UTF-8 in Unicode NFC form. The reference library also caps names at 256 bytes (NC_MAX_NAME).
 *
 * A leading '_' is reserved for names with meaning to implementations (such as _FillValue); it is
 * allowed, since such attributes are written on purpose.
 */
export const NC_MAX_NAME = 256;

/** The reason a name breaks the rules, or null when it is a valid NetCDF name. */
export function netcdfNameProblem(name: string): string | null {
  if (typeof name !== 'string') return 'a name must be a string';
  if (name.length === 0) return 'a name may not be empty';
  const lone = loneSurrogateAt(name);
  if (lone >= 0) return `not valid Unicode (${loneSurrogateMessage(lone)})`;
  const bytes = new TextEncoder().encode(name).length;
  if (bytes > NC_MAX_NAME) return `longer than ${NC_MAX_NAME} bytes of UTF-8 (${bytes})`;
  if (name.normalize('NFC') !== name) return 'not in Unicode NFC normal form';
  const first = name.charCodeAt(0);
  if (first < 0x80 && !isAsciiAlnum(first) && first !== 0x5f) {
    return `the first character ${JSON.stringify(name[0])} must be a letter, a digit, '_' or a non-ASCII character`;
  }
  for (let i = 0; i < name.length; i++) {
    const c = name.charCodeAt(i);
    if (c < 0x20 || c === 0x7f)
      return `control character U+${c.toString(16).padStart(4, '0').toUpperCase()} at position ${i}`;
    if (c === 0x2f) return `'/' is not allowed (position ${i})`;
  }
  if (name.endsWith(' ')) return 'trailing spaces are not allowed';
  return null;
}

/**
 * The UTF-8 bytes of a NetCDF name or text. The format stores text as UTF-8, which has no form for a
 * lone surrogate: such text is refused (a RangeError) rather than written as U+FFFD, as TextEncoder
 * would.
 */
export function netcdfTextBytes(text: string): Uint8Array {
  const lone = loneSurrogateAt(text);
  if (lone >= 0) throw new RangeError(loneSurrogateMessage(lone));
  return new TextEncoder().encode(text);
}

/** The position of the first UTF-16 surrogate without its partner, or −1. */
function loneSurrogateAt(text: string): number {
  return text.search(/\p{Cs}/u);
}

function loneSurrogateMessage(position: number): string {
  return `lone surrogate at position ${position}: not encodable as UTF-8`;
}

/** Throws a RangeError naming `what` (for example 'variable "q"') when the name is not valid. */
export function checkNetcdfName(name: string, what: string): void {
  const problem = netcdfNameProblem(name);
  if (problem !== null) throw new RangeError(`NetCDF: ${what} has an invalid name ${JSON.stringify(name)}: ${problem}`);
}

function isAsciiAlnum(c: number): boolean {
  return (c >= 0x30 && c <= 0x39) || (c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a);
}
