/**
 * End-to-end: tyre and wheel sizes typed as the trade writes them in the vehicle form, resolved,
 * shown back and set on the tyres. Expected diameters hand-computed from the size designation
 * (ISO 4000-1 / ETRTO / Tire and Rim Association): 315/70R17 → 17·25.4 + 2·0.70·315 = 872.8 mm.
 */
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchChromium, waitForScene, watchedPage } from './browser';

let browser: Browser;
let page: Page;
const errors: string[] = [];

type Win = { __plumbline: { store: { getState(): { scenario: { vehicle: { tyreFront: { radiusM: number; widthM: number; stiffnessNPerM: number }; tyreRear: { radiusM: number; widthM: number } } } } } } };

beforeAll(async () => {
  browser = await launchChromium();
  page = await watchedPage(browser, errors);
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});
afterAll(async () => {
  await browser?.close();
});

const tyres = () => page.evaluate(() => (window as unknown as Win).__plumbline.store.getState().scenario.vehicle);

it('a metric size resolves to its diameter and width and sets both axles\' tyres', async () => {
  await page.locator('section[aria-labelledby="vehicle-h"] summary').click();
  const input = page.getByTestId('tyre-size');
  await input.fill('315/70R17');
  const resolved = page.getByTestId('tyre-size-resolved');
  await expect.poll(() => resolved.textContent()).toContain('diameter 872.8 mm');
  const text = (await resolved.textContent()) ?? '';
  expect(text).toContain('radius 436.4 mm');
  expect(text).toContain('section width 315.0 mm');
  expect(text).toMatch(/from memory/);
  const before = await tyres();
  await page.getByTestId('tyre-size-apply').click();
  await expect.poll(async () => (await tyres()).tyreFront.radiusM).toBeCloseTo(0.4364, 9);
  const after = await tyres();
  expect(after.tyreRear.radiusM).toBeCloseTo(0.4364, 9);
  expect(after.tyreFront.widthM).toBeCloseTo(0.315, 9);
  // The stiffness is kept unless the estimate is asked for.
  expect(after.tyreFront.stiffnessNPerM).toBe(before.tyreFront.stiffnessNPerM);
  // The form's radius field shows the new value (m, metric demo).
  await expect.poll(() => page.getByTestId('field-vehicle.tyre.radius').inputValue()).toBe('0.4364');
});

it('a bare 35 asks whether the diameter is meant; yes gives a 35 in tyre, not a 70 in one', async () => {
  await page.getByTestId('tyre-size').fill('35');
  await expect.poll(() => page.getByTestId('tyre-size-question').textContent()).toMatch(/overall diameter in inches/);
  expect(await page.getByTestId('tyre-size-resolved').count()).toBe(0);
  await page.getByTestId('tyre-size-yes').click();
  await expect.poll(() => page.getByTestId('tyre-size-resolved').textContent()).toContain('diameter 889.0 mm, radius 444.5 mm');
  await page.getByTestId('tyre-size-axle').selectOption('front');
  await page.getByTestId('tyre-size-apply').click();
  await expect.poll(async () => (await tyres()).tyreFront.radiusM).toBeCloseTo(0.4445, 9);
  expect((await tyres()).tyreRear.radiusM).toBeCloseTo(0.4364, 9);
});

it('a flotation size and a wheel with its backspacing worked out (common practice)', async () => {
  await page.getByTestId('tyre-size').fill('35x12.50R17');
  await expect.poll(() => page.getByTestId('tyre-size-resolved').textContent()).toContain('section width 317.5 mm');
  await page.getByTestId('wheel-size').fill('17x9 -12');
  // (9 + 1)/2 + (−12)/25.4 = 4.53 in.
  await expect.poll(() => page.getByTestId('wheel-size-resolved').textContent()).toContain('backspacing 4.53 in');
  await page.getByTestId('tyre-size').fill('banana');
  await expect.poll(() => page.locator('[data-testid="tyre-size-group"] .field-error').first().textContent()).toMatch(/not a tyre size/);
  expect(errors).toEqual([]);
});
