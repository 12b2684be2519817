import { svelte } from '@sveltejs/vite-plugin-svelte';
import { defineConfig } from 'vite';

// The app: index.html at the repo root, built to dist/. Relative base so dist/ can be served from
// any path (a project page, a file share, the e2e server). Workers are ES module workers
// (`new Worker(new URL(...), { type: 'module' })`), so they may import the model like any module.
export default defineConfig({
  base: './',
  plugins: [svelte()],
  worker: { format: 'es' },
  build: { outDir: 'dist', emptyOutDir: true, target: 'es2022', sourcemap: true },
});
