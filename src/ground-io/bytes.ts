/** Shared checks for the ground readers: every problem becomes a GroundError naming the file. */
import { GroundError } from '../core/ground/types';

/** Most points, vertices or triangles a reader accepts (a 50 MB scan holds ~2 million; 200 million is ~5 GB of memory). */
export const MAX_ELEMENTS = 200_000_000;

export function fail(file: string, problem: string): never {
  throw new GroundError(`${file}: ${problem}`);
}

/** Text of the first `max` bytes (latin-1: every byte one character), for headers. */
export function headText(bytes: Uint8Array, max: number): string {
  const n = Math.min(bytes.length, max);
  let s = '';
  // One byte, one character (Latin-1), without spreading a large array into a call's arguments.
  for (let i = 0; i < n; i++) s += String.fromCharCode(bytes[i]);
  return s;
}

export function checkCount(file: string, what: string, n: number): void {
  if (!Number.isInteger(n) || n < 0) fail(file, `the header's ${what} count is not a whole number: ${n}`);
  const plural = what.endsWith('x') ? `${what.slice(0, -2)}ices` : `${what}s`;
  if (n > MAX_ELEMENTS) fail(file, `the header claims ${n.toLocaleString('en-US')} ${plural}, more than the ${MAX_ELEMENTS.toLocaleString('en-US')} this import takes`);
}

/** UTF-8 text of the whole file. */
export function textOf(bytes: Uint8Array): string {
  return new TextDecoder('utf-8').decode(bytes);
}

/** The message of whatever a library threw, or a fallback when it gave none. */
export function reason(e: unknown, fallback: string): string {
  const m = e instanceof Error ? e.message : typeof e === 'string' ? e : '';
  return m && m !== 'undefined' ? m : fallback;
}

/**
 * `a` with room for one more triple after the `n` in use: the same array while there is room, else
 * one of twice the size holding the same values (the new count checked against the import's limit).
 */
export function roomForTriple<T extends Float64Array | Uint32Array>(file: string, what: string, a: T, n: number): T {
  if (3 * (n + 1) <= a.length) return a;
  const cap = (a.length / 3) * 2;
  checkCount(file, what, cap);
  const b = new (a.constructor as new (length: number) => T)(cap * 3);
  b.set(a);
  return b;
}
