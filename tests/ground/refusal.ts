/**
 * The bad-input rule for ground files, in one place: the attempt throws a GroundError whose message
 * starts with the file's name and says the problem, within a second (the ground issue's limit).
 */
import { expect } from 'vitest';
import { GroundError } from '../../src/core/ground/index';

export async function expectRefusal(file: string, message: RegExp, attempt: () => Promise<unknown>): Promise<void> {
  const t0 = performance.now();
  let err: unknown = null;
  try {
    await attempt();
  } catch (e) {
    err = e;
  }
  const ms = performance.now() - t0;
  expect(err).toBeInstanceOf(GroundError);
  const msg = (err as Error).message;
  expect(msg.startsWith(`${file}: `), msg).toBe(true);
  expect(msg).toMatch(message);
  if (process.env.GROUND_SHOW_MESSAGES) console.log(msg);
  expect(ms).toBeLessThan(1000);
}
