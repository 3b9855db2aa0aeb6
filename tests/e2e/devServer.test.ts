/**
 * The README's first command, `npm start`, runs the Vite dev server, not the built app the other
 * browser tests use. React's development build is stricter (effects are run twice, a cleanup that
 * is not a function throws), so this opens the dev server once and checks the demo comes up
 * solved with no page error.
 */
import { createServer, type ViteDevServer } from 'vite';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { isHarmless, launchChromium, waitForScene } from './browser';

let server: ViteDevServer;
let browser: Browser;
let url = '';

beforeAll(async () => {
  server = await createServer({ server: { host: '127.0.0.1', port: 0, strictPort: false }, logLevel: 'silent', clearScreen: false });
  await server.listen();
  const address = server.httpServer?.address();
  if (!address || typeof address === 'string') throw new Error('dev server: no address');
  url = `http://127.0.0.1:${address.port}/`;
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
});

it('npm start: the dev server shows the demo solved, with no page error', async () => {
  const page = await browser.newPage({ viewport: { width: 1280, height: 720 } });
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error' && !isHarmless(m.text())) errors.push(m.text());
  });
  await page.goto(url);
  await waitForScene(page);
  await expect(page.getByTestId('wheel-load-FL').textContent()).resolves.toMatch(/\d/);
  expect(errors).toEqual([]);
  await page.close();
}, 120_000);
