import { existsSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { resolve } from 'node:path';
import { preview } from 'vite';
import type { TestProject } from 'vitest/node';

declare module 'vitest' {
  export interface ProvidedContext {
    /** Where the built app is served for this run, e.g. http://127.0.0.1:40123/ */
    baseUrl: string;
  }
}

/**
 * Global setup of the browser tests: serve the built dist/ with `vite preview` on a free port
 * (port 0: the system picks one, so parallel runs never collide) and hand its address to the tests.
 */
export default async function serveDist(project: TestProject): Promise<() => Promise<void>> {
  const root = resolve(import.meta.dirname, '../..');
  if (!existsSync(resolve(root, 'dist/index.html'))) {
    throw new Error('dist/index.html is missing: build the app first (`npm run build`, or `npm run test:e2e`)');
  }
  const server = await preview({
    root,
    logLevel: 'warn',
    preview: { host: '127.0.0.1', port: 0, strictPort: true, open: false },
  });
  const { port } = server.httpServer.address() as AddressInfo;
  project.provide('baseUrl', `http://127.0.0.1:${port}/`);
  return () => server.close();
}
