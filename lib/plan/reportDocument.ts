/**
 * A small document model for printable reports, rendered to Markdown or to self-contained HTML.
 * Every piece of text is plain text and is escaped by the renderer, never inserted raw; the only
 * markup that passes through is an SVG figure made by Stria's own generator (which escapes its text).
 */
export type Block =
  | { type: 'heading'; level: 1 | 2 | 3; text: string }
  | { type: 'paragraph'; text: string }
  | { type: 'list'; items: string[] }
  | { type: 'table'; head: string[]; rows: string[][] }
  | { type: 'figure'; svg: string; caption: string };

/** Escape text for HTML character data and attribute values. */
export function escapeHtml(s: string): string {
  return s
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/**
 * Escape text for Markdown: HTML-significant characters become entities (so no raw HTML reaches a
 * renderer), the inline punctuation that could start emphasis, code, links, tables or strike-through
 * is backslash-escaped, and line breaks become spaces. With `blockStart`, a leading block marker
 * (#, -, +, "1.") is escaped too, for text that begins a paragraph or a list item.
 */
export function escapeMarkdown(s: string, blockStart = false): string {
  const inline = s
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/([\\`*_[\]|~])/g, '\\$1')
    .replace(/\r?\n/g, ' ');
  return blockStart ? inline.replace(/^(\s*)([#+-])/, '$1\\$2').replace(/^(\s*)(\d+)\./, '$1$2\\.') : inline;
}

/** Markdown text of a document; figures are embedded as SVG data-URI images (no external requests). */
export function renderMarkdown(blocks: Block[]): string {
  const out: string[] = [];
  for (const b of blocks) {
    switch (b.type) {
      case 'heading':
        out.push(`${'#'.repeat(b.level)} ${escapeMarkdown(b.text)}`);
        break;
      case 'paragraph':
        out.push(escapeMarkdown(b.text, true));
        break;
      case 'list':
        out.push(b.items.map((i) => `- ${escapeMarkdown(i, true)}`).join('\n'));
        break;
      case 'table': {
        const row = (cells: string[]) => `| ${cells.map((c) => escapeMarkdown(c)).join(' | ')} |`;
        out.push([row(b.head), `|${b.head.map(() => ' --- |').join('')}`, ...b.rows.map(row)].join('\n'));
        break;
      }
      case 'figure':
        out.push(`![${escapeMarkdown(b.caption)}](data:image/svg+xml;charset=utf-8,${encodeURIComponent(b.svg)})`);
        break;
    }
  }
  return out.join('\n\n') + '\n';
}

const STYLE = `
body { font-family: sans-serif; max-width: 60rem; margin: 2rem auto; padding: 0 1rem; color: #111; line-height: 1.4; }
table { border-collapse: collapse; margin: 0.5rem 0 1rem; font-size: 0.9rem; }
th, td { border: 1px solid #bbb; padding: 0.2rem 0.45rem; text-align: left; vertical-align: top; }
th { background: #f0f0f0; }
figure { margin: 1rem 0; }
figcaption { font-size: 0.85rem; color: #444; }
@media print { body { margin: 0; max-width: none; } h2 { break-after: avoid; } table, figure { break-inside: avoid; } }
`;

/**
 * A self-contained HTML page: inline style only, no scripts, no external requests (the
 * Content-Security-Policy forbids them), text escaped.
 */
export function renderHtml(title: string, blocks: Block[]): string {
  const body: string[] = [];
  for (const b of blocks) {
    switch (b.type) {
      case 'heading':
        body.push(`<h${b.level}>${escapeHtml(b.text)}</h${b.level}>`);
        break;
      case 'paragraph':
        body.push(`<p>${escapeHtml(b.text)}</p>`);
        break;
      case 'list':
        body.push(`<ul>\n${b.items.map((i) => `<li>${escapeHtml(i)}</li>`).join('\n')}\n</ul>`);
        break;
      case 'table':
        body.push(
          `<table>\n<thead><tr>${b.head.map((h) => `<th>${escapeHtml(h)}</th>`).join('')}</tr></thead>\n<tbody>\n` +
            b.rows.map((r) => `<tr>${r.map((c) => `<td>${escapeHtml(c)}</td>`).join('')}</tr>`).join('\n') +
            '\n</tbody>\n</table>',
        );
        break;
      case 'figure':
        body.push(`<figure>\n${b.svg}\n<figcaption>${escapeHtml(b.caption)}</figcaption>\n</figure>`);
        break;
    }
  }
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'">`,
    `<title>${escapeHtml(title)}</title>`,
    `<style>${STYLE}</style>`,
    '</head>',
    '<body>',
    ...body,
    '</body>',
    '</html>',
    '',
  ].join('\n');
}
