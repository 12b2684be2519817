import type { Plugin } from 'vite';

/**
 * The Content Security Policy of the built app (W3C Content Security Policy Level 3). The app is
 * static: every script, style, worker and chunk comes from its own origin, and it fetches nothing,
 * so everything else is shut:
 *   script-src 'self'   no inline scripts and no eval or new Function (test/reliability/
 *                       noHtmlInjection.test.ts keeps the code free of them; the bundle has none)
 *   style-src 'self'    the page's styles are CSS files (src/app.css, the components' extracted
 *                       styles, uPlot's); Svelte's style: directives and uPlot set styles through
 *                       the CSSOM (element.style), which CSP does not restrict, so no 'unsafe-inline'
 *   img-src 'self' data:  the icon is a data: URL in index.html
 *   worker-src 'self'   the workers are files of the build (new Worker(new URL(…))), never blobs
 *   connect-src 'self'  the app fetches nothing; 'self' rather than 'none' because vite's module-preload
 *                       fallback (for browsers without <link rel=modulepreload>) fetches its own chunks
 *   media-src 'none'    WebM recording (src/share/fieldRecorder.ts) captures a canvas and loads no media
 *   object-src, base-uri, form-action 'none'  no plugins, no <base>, no forms that submit
 * It is a <meta http-equiv> tag because static hosting cannot be relied on to send headers. Two
 * consequences, both in CSP3: frame-ancestors, report-uri and sandbox are ignored in a meta tag, so
 * they are left out; and a worker loaded from a URL takes its policy from its own response, not from
 * the page (only blob: and data: workers inherit it), so
 * the workers are held to the origin by worker-src and by what they import (e2e/security.e2e.test.ts
 * records every request the page and its workers make).
 */
export const CONTENT_POLICY: Readonly<Record<string, readonly string[]>> = {
  'default-src': ["'self'"],
  'script-src': ["'self'"],
  'style-src': ["'self'"],
  'img-src': ["'self'", 'data:'],
  'font-src': ["'self'"],
  'worker-src': ["'self'"],
  'connect-src': ["'self'"],
  'media-src': ["'none'"],
  'object-src': ["'none'"],
  'base-uri': ["'none'"],
  'form-action': ["'none'"],
};

/** The policy as the content of the meta tag: "default-src 'self'; script-src 'self'; …". */
export function contentPolicyText(policy: Readonly<Record<string, readonly string[]>> = CONTENT_POLICY): string {
  return Object.entries(policy)
    .map(([name, sources]) => `${name} ${sources.join(' ')}`)
    .join('; ');
}

/**
 * Put the policy into index.html right after <meta charset>, before any script, style or link
 * (a policy in a meta tag covers only what comes after it). Throws when there is no charset tag, so
 * the build cannot silently ship without the policy.
 */
export function injectContentPolicy(html: string, policyText = contentPolicyText()): string {
  const charset = /<meta\s+charset=["']?utf-8["']?\s*\/?>/i.exec(html);
  if (!charset) throw new Error('index.html has no <meta charset="utf-8"> to put the Content Security Policy after');
  const end = charset.index + charset[0].length;
  const tag = `\n    <meta http-equiv="Content-Security-Policy" content="${policyText}" />`;
  return html.slice(0, end) + tag + html.slice(end);
}

/**
 * The vite plugin. Build only: the dev server (npm start) injects inline <style> elements for CSS
 * and talks to its client over a WebSocket for hot reloading, both of which this policy forbids.
 */
export function contentPolicyPlugin(): Plugin {
  return {
    name: 'stria-content-policy',
    apply: 'build',
    transformIndexHtml: { order: 'post', handler: (html) => injectContentPolicy(html) },
  };
}
