/**
 * The garage in the built app (IndexedDB in headless Chromium): a fleet officer keeps three units,
 * each with its unit number; they survive a reload and a closed tab; rename, duplicate, delete and
 * open act on one entry; export all and import into a fresh browser profile give the same list; a
 * damaged entry written straight into the database is listed as damaged and the others still open.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { isHarmless, launchChromium, waitForScene } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
});

async function newContext(): Promise<{ ctx: BrowserContext; page: Page; errors: string[] }> {
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 }, serviceWorkers: 'block', acceptDownloads: true });
  const page = await ctx.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error' && !isHarmless(m.text())) errors.push(m.text());
  });
  page.on('dialog', (d) => void d.accept());
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
  return { ctx, page, errors };
}

const items = (page: Page) => page.getByTestId('garage-list').getByTestId('garage-item');
const names = (page: Page) => page.getByTestId('garage-list').getByTestId('garage-item-name').allTextContents();
const xOf = (page: Page) => page.evaluate(() => window.__plumbline!.store.getState().scenario.pose.xM);

describe('garage', () => {
  it('keeps three units through a reload and a closed tab; rename, duplicate, delete, open; export and import', async () => {
    const { ctx, page, errors } = await newContext();
    for (const [i, unit] of ['LV-101', 'LV-102', 'LV-103'].entries()) {
      await page.getByTestId('pose-x').fill(String(1 + i / 10));
      await expect.poll(() => xOf(page)).toBe(1 + i / 10);
      await page.getByTestId('garage-name').fill(`Site utility ${unit}`);
      await page.getByTestId('garage-customer').fill(unit);
      await page.getByTestId('garage-save').click();
      await expect.poll(() => items(page).count()).toBe(i + 1);
    }
    expect((await names(page)).sort()).toEqual(['Site utility LV-101', 'Site utility LV-102', 'Site utility LV-103']);
    await page.reload();
    await waitForScene(page);
    await expect.poll(() => items(page).count()).toBe(3);
    await page.close({ runBeforeUnload: false });
    const page2 = await ctx.newPage();
    page2.on('dialog', (d) => void d.accept());
    await page2.goto(inject('baseUrl'));
    await waitForScene(page2);
    await expect.poll(() => items(page2).count()).toBe(3);

    // Open LV-101 (x = 1.0): the scenario changes, and Undo goes back.
    await page2.getByTestId('pose-x').fill('2.5');
    await expect.poll(() => xOf(page2)).toBe(2.5);
    const lv101 = items(page2).filter({ hasText: 'LV-101' });
    await lv101.getByTestId('garage-open').click();
    await expect.poll(() => xOf(page2)).toBe(1);
    await page2.getByTestId('undo').click();
    await expect.poll(() => xOf(page2)).toBe(2.5);

    // Rename one, duplicate another, delete a third.
    await items(page2).filter({ hasText: 'LV-102' }).getByTestId('garage-rename').click();
    await page2.getByTestId('garage-rename-name').fill('Site utility LV-102 (new tyres)');
    await page2.getByTestId('garage-rename-ok').click();
    await items(page2).filter({ hasText: 'LV-103' }).getByTestId('garage-duplicate').click();
    await expect.poll(() => items(page2).count()).toBe(4);
    await items(page2).filter({ hasText: 'LV-101' }).getByTestId('garage-delete').click();
    await expect.poll(() => items(page2).count()).toBe(3);
    expect((await names(page2)).sort()).toEqual(['Site utility LV-102 (new tyres)', 'Site utility LV-103', 'Site utility LV-103 (copy)']);

    // Export all, then import into a fresh profile.
    const [download] = await Promise.all([page2.waitForEvent('download'), page2.getByTestId('garage-export').click()]);
    const text = readFileSync((await download.path())!, 'utf8');
    expect(JSON.parse(text).entries).toHaveLength(3);
    const fresh = await newContext();
    await fresh.page.getByTestId('garage-import').setInputFiles({ name: 'garage.json', mimeType: 'application/json', buffer: Buffer.from(text) });
    await expect.poll(() => items(fresh.page).count()).toBe(3);
    expect((await names(fresh.page)).sort()).toEqual((await names(page2)).sort());
    expect(await fresh.page.getByTestId('garage-note').textContent()).toBe('Imported 3 entries.');
    expect(errors).toEqual([]);
    expect(fresh.errors).toEqual([]);
    await fresh.ctx.close();
    await ctx.close();
  });

  it('a damaged entry is listed as damaged; the others still open, and it can be deleted', async () => {
    const { ctx, page } = await newContext();
    await page.getByTestId('garage-name').fill('Good unit');
    await page.getByTestId('garage-save').click();
    await expect.poll(() => items(page).count()).toBe(1);
    // Damage: a record written straight into the database, as a failing disk or an old version might leave it.
    await page.evaluate(
      () =>
        new Promise<void>((res, rej) => {
          const r = indexedDB.open('plumbline');
          r.onsuccess = () => {
            const tx = r.result.transaction('garage', 'readwrite');
            tx.objectStore('garage').put({ name: 'Half written', savedAtMs: 1, file: { version: 1, vehicle: { mass: 'heavy' } } }, 'broken');
            tx.oncomplete = () => res();
            tx.onerror = () => rej(tx.error);
          };
          r.onerror = () => rej(r.error);
        }),
    );
    await page.reload();
    await waitForScene(page);
    await expect.poll(() => items(page).count()).toBe(2);
    const damaged = page.locator('[data-testid="garage-item"][data-damaged="true"]');
    expect(await damaged.textContent()).toMatch(/Half written damaged: the scenario does not validate/);
    await page.getByTestId('pose-x').fill('2.2');
    await items(page).filter({ hasText: 'Good unit' }).getByTestId('garage-open').click();
    await expect.poll(() => xOf(page)).not.toBe(2.2);
    await damaged.getByTestId('garage-delete').click();
    await expect.poll(() => items(page).count()).toBe(1);
    await ctx.close();
  });
});
