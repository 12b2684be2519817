/**
 * The two response headers that make the app's page cross-origin isolated (HTML Standard,
 * "cross-origin isolation"; Fetch's Cross-Origin-Embedder-Policy), so that its workers may share
 * memory (SharedArrayBuffer) and the step can run on several threads (docs/threads.md). The app loads
 * nothing from other origins, so require-corp costs it nothing. `npm start` and `npm run preview`
 * send them (vite.config.ts); a static host must send them too, or the app steps on one thread and
 * says so. Headers, not meta tags: neither policy can be set from the page itself.
 */
export const ISOLATION_HEADERS: Readonly<Record<string, string>> = {
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Embedder-Policy': 'require-corp',
};
