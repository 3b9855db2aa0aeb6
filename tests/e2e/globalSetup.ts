/**
 * Serves the built app (dist/) on 127.0.0.1 with vite's preview() JS API for the e2e tests, and
 * fails at once, naming the browser, when Chromium is not installed.
 */
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { preview, type PreviewServer } from 'vite';
import type { TestProject } from 'vitest/node';
import { CHROMIUM_PATH } from './browser';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

let server: PreviewServer | null = null;

export async function setup(project: TestProject): Promise<void> {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(
      `e2e: Chromium was not found at ${CHROMIUM_PATH}. Install the OS package (apt-get install -y chromium); the tests never download a browser.`,
    );
  }
  const root = resolve(import.meta.dirname, '../..');
  if (!existsSync(resolve(root, 'dist/index.html'))) {
    throw new Error('e2e: dist/index.html is missing: build the app first (npm run test:e2e runs vite build).');
  }
  server = await preview({ root, logLevel: 'warn', preview: { host: '127.0.0.1', port: 0, strictPort: false, open: false } });
  const url = server.resolvedUrls?.local[0];
  if (!url) throw new Error('e2e: vite preview did not report a local address');
  project.provide('baseUrl', url);
}

export async function teardown(): Promise<void> {
  if (server) await new Promise<void>((res, rej) => server!.httpServer.close((e) => (e ? rej(e) : res())));
  server = null;
}
