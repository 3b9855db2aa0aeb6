/// <reference types="vitest/config" />
import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { defineConfig, type Plugin, type ResolvedConfig } from 'vite';
import react from '@vitejs/plugin-react';

/**
 * Writes the build's id (a hash of every output file) and its file list into dist/sw.js, so each
 * build has a byte-different service worker with its own cache name: browsers install the new one,
 * and it deletes the old build's cache on activate.
 */
function serviceWorkerBuildId(): Plugin {
  let config: ResolvedConfig;
  let build = '';
  let assets: string[] = [];
  return {
    name: 'plumbline-sw-build-id',
    apply: 'build',
    configResolved(c) {
      config = c;
    },
    generateBundle(_options, bundle) {
      const hash = createHash('sha256');
      const names = Object.keys(bundle).sort();
      for (const name of names) {
        const out = bundle[name];
        hash.update(name);
        hash.update(out.type === 'chunk' ? out.code : typeof out.source === 'string' ? out.source : Buffer.from(out.source));
      }
      build = hash.digest('hex').slice(0, 16);
      assets = names.filter((n) => n !== 'index.html').map((n) => `./${n}`);
    },
    closeBundle() {
      const outDir = resolve(config.root, config.build.outDir);
      const swPath = resolve(outDir, 'sw.js');
      const publicFiles = ['./manifest.webmanifest', './icon.svg'];
      const text = readFileSync(swPath, 'utf8')
        .replace(`'dev' /*__PLUMBLINE_BUILD__*/`, JSON.stringify(build))
        .replace('/*__PLUMBLINE_ASSETS__*/', [...assets, ...publicFiles].map((a) => JSON.stringify(a)).join(', '));
      if (!text.includes(JSON.stringify(build))) throw new Error('sw.js: the build id placeholder was not found');
      writeFileSync(swPath, text);
    },
  };
}

/** Sent by the dev and preview servers: no other site may frame the app (see README, "Headers"). */
const SECURITY_HEADERS = { 'Content-Security-Policy': "frame-ancestors 'none'", 'X-Frame-Options': 'DENY' };

export default defineConfig({
  plugins: [react(), serviceWorkerBuildId()],
  base: './',
  build: { outDir: 'dist', sourcemap: false },
  // Module workers (the app creates every worker with type: 'module'): a worker's dynamic import()
  // becomes a chunk of its own, so the ground worker loads three's USD loader only for a USDZ file.
  worker: { format: 'es' },
  server: { headers: SECURITY_HEADERS },
  preview: { headers: SECURITY_HEADERS },
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    exclude: ['tests/e2e/**', 'node_modules/**'],
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
