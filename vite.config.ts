import { svelte } from '@sveltejs/vite-plugin-svelte';
import { defineConfig } from 'vite';
import { contentPolicyPlugin } from './scripts/contentPolicy.ts';
import { ISOLATION_HEADERS } from './scripts/isolationHeaders.ts';

// The app: index.html at the repo root, built to dist/. Relative base so dist/ can be served from
// any path (a project page, a file share, the e2e server). Workers are ES module workers
// (`new Worker(new URL(...), { type: 'module' })`), so they may import the model like any module.
// The built index.html carries a strict Content Security Policy (scripts/contentPolicy.ts; build only).
// The dev server and the preview send the cross-origin isolation headers (scripts/isolationHeaders.ts),
// so the step may run on several threads.
export default defineConfig({
  base: './',
  plugins: [svelte(), contentPolicyPlugin()],
  worker: { format: 'es' },
  server: { headers: { ...ISOLATION_HEADERS } },
  preview: { headers: { ...ISOLATION_HEADERS } },
  build: { outDir: 'dist', emptyOutDir: true, target: 'es2022', sourcemap: true },
});
