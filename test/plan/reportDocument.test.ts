import { describe, expect, it } from 'vitest';
import { escapeHtml, escapeMarkdown, renderHtml, renderMarkdown, type Block } from '../../lib/plan/reportDocument';

const hostile = `<script>alert("x")</script> & *bold* [link](http://example.org) | pipe`;
const blocks: Block[] = [
  { type: 'heading', level: 1, text: hostile },
  { type: 'paragraph', text: `# not a heading ${hostile}` },
  { type: 'list', items: ['- not nested', '1. not ordered'] },
  { type: 'table', head: ['a|b', 'c'], rows: [[hostile, '2.5e-6']] },
  { type: 'figure', svg: '<svg viewBox="0 0 1 1"><rect width="1" height="1"/></svg>', caption: hostile },
];

describe('report document', () => {
  it('escapes HTML text and attributes', () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;');
  });

  it('renders HTML with no raw user markup, no scripts and no external requests', () => {
    const html = renderHtml(hostile, blocks);
    expect(html).not.toMatch(/<script/i);
    expect(html).toContain('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;');
    expect(html).not.toMatch(/\b(src|href)\s*=/i);
    expect(html).not.toMatch(/url\(|@import/i);
    expect(html).toContain(`content="default-src 'none'; style-src 'unsafe-inline'"`);
    expect(html).toContain('<svg viewBox="0 0 1 1"><rect width="1" height="1"/></svg>');
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
  });

  it('escapes Markdown so no HTML, emphasis, link or table break gets through', () => {
    expect(escapeMarkdown('a*b_c|d[e]`f`~g <h> &')).toBe('a\\*b\\_c\\|d\\[e\\]\\`f\\`\\~g &lt;h&gt; &amp;');
    expect(escapeMarkdown('# x', true)).toBe('\\# x');
    expect(escapeMarkdown('12. x', true)).toBe('12\\. x');
    expect(escapeMarkdown('2.5e-6')).toBe('2.5e-6'); // inside a table cell nothing starts a block
    const md = renderMarkdown(blocks);
    expect(md).not.toMatch(/<script/i);
    expect(md).toContain('| a\\|b | c |');
    expect(md).toContain('- \\- not nested');
    expect(md).toContain('- 1\\. not ordered');
    expect(md).toContain('\\# not a heading');
    expect(md).toMatch(/!\[.*\]\(data:image\/svg\+xml;charset=utf-8,%3Csvg%20viewBox/);
    expect(md).toContain('\\[link\\](http://example.org)'); // an escaped bracket makes no link
    expect(md).not.toMatch(/(^|[^\\])\[link/m);
  });
});
