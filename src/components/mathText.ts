/**
 * Text with the plain subscript and superscript notation of Stria's labels and formulas (k_R, U_rms,
 * (β³/ε)^{1/5}, 720^{1/4}) split into pieces to show as subscripts and superscripts, so no raw
 * notation reaches the page: `_x` or `_{…}` is a subscript, `^x` or `^{…}` a superscript, where x is
 * a run of letters and digits (a superscript may start with a sign). Nothing else is interpreted.
 */
export interface MathPiece {
  text: string;
  kind: 'plain' | 'sub' | 'sup';
}

const SUB_RUN = /^[\p{L}\p{Nd}]+/u;
const SUP_RUN = /^[−+-]?[\p{L}\p{Nd}/.½⅓¼⅕]+/u;

export function mathPieces(text: string): MathPiece[] {
  const out: MathPiece[] = [];
  let plain = '';
  let i = 0;
  const flush = () => {
    if (plain) out.push({ text: plain, kind: 'plain' });
    plain = '';
  };
  while (i < text.length) {
    const c = text[i];
    // An underscore between letters (a key like u_rms inside a word) is a subscript too; a lone one is text.
    if ((c === '_' || c === '^') && i > 0) {
      const rest = text.slice(i + 1);
      let body: string | null = null;
      let used = 0;
      if (rest.startsWith('{')) {
        const end = rest.indexOf('}');
        if (end > 0) {
          body = rest.slice(1, end);
          used = end + 1;
        }
      } else {
        const m = (c === '_' ? SUB_RUN : SUP_RUN).exec(rest);
        if (m) {
          body = m[0];
          used = m[0].length;
        }
      }
      if (body !== null) {
        flush();
        out.push({ text: body.replace(/-/g, '−'), kind: c === '_' ? 'sub' : 'sup' });
        i += 1 + used;
        continue;
      }
    }
    plain += c;
    i++;
  }
  flush();
  return out;
}
