import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

// TypeScript in <script lang="ts"> blocks; runes mode everywhere (the app uses no legacy syntax).
export default {
  preprocess: vitePreprocess(),
  compilerOptions: { runes: true },
};
