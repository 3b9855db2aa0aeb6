/// <reference types="vitest/config" />
/**
 * End-to-end tests: headless Chromium (OS package) driven by playwright-core against the built
 * app (dist/, from `vite build`) served by vite's preview() on 127.0.0.1. Run with
 * `npm run test:e2e`.
 */
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/e2e/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/e2e/globalSetup.ts'],
    testTimeout: 90_000,
    hookTimeout: 90_000,
    // One browser at a time (the machine has 2 cores).
    fileParallelism: false,
  },
});
