/** Launching the OS Chromium for the e2e tests and the benchmark (flags per shared/TOOLING.md). */
import { chromium, type Browser, type Page } from 'playwright-core';

export const CHROMIUM_PATH = '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--use-gl=angle',
  '--use-angle=swiftshader',
  '--enable-unsafe-swiftshader',
];

export function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
}

/** Console noise that is not a fault of the app (see shared/TOOLING.md). */
export function isHarmless(text: string): boolean {
  return /GPU stall due to ReadPixels|favicon|unexpected operator|THREE\.Clock|Clock: This module has been deprecated/i.test(text);
}

/** Waits until the app has drawn its first solved frame. */
export async function waitForScene(page: Page): Promise<void> {
  await page.waitForFunction(() => (window as unknown as { __plumbline?: { scene: { stats: { firstFrameMs: number | null } } | null } }).__plumbline?.scene?.stats.firstFrameMs != null, undefined, { timeout: 30_000 });
}

/**
 * A page in a fresh context (no service worker from an earlier test) that collects uncaught page
 * errors and console errors, the harmless ones aside, into `errors`. `device` emulates a phone or
 * tablet (touch, mobile viewport, pixel ratio).
 */
export async function watchedPage(
  browser: Browser,
  errors: string[],
  viewport = { width: 1280, height: 800 },
  device: { hasTouch?: boolean; isMobile?: boolean; deviceScaleFactor?: number } = {},
): Promise<Page> {
  const context = await browser.newContext({ viewport, serviceWorkers: 'block', ...device });
  const page = await context.newPage();
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error' && !isHarmless(m.text())) errors.push(m.text());
  });
  return page;
}
