/**
 * Base64 (RFC 4648 §4) for the compact grid form in scenario files: heights as little-endian
 * float32, the filled mask one bit per node. Our own codec: no Buffer, atob or btoa, so the core
 * stays free of platform objects and a 5 MB string decodes without a 5 MB intermediate string.
 */
const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
const LOOKUP = new Int16Array(128).fill(-1);
for (let i = 0; i < 64; i++) LOOKUP[ALPHABET.charCodeAt(i)] = i;

export function encodeBase64(bytes: Uint8Array): string {
  const parts: string[] = [];
  const chunk = 3 * 16384;
  for (let start = 0; start < bytes.length; start += chunk) {
    const end = Math.min(bytes.length, start + chunk);
    const codes = new Array<number>();
    for (let i = start; i < end; i += 3) {
      const a = bytes[i];
      const b = i + 1 < end ? bytes[i + 1] : 0;
      const c = i + 2 < end ? bytes[i + 2] : 0;
      codes.push(ALPHABET.charCodeAt(a >> 2), ALPHABET.charCodeAt(((a & 3) << 4) | (b >> 4)));
      codes.push(i + 1 < end ? ALPHABET.charCodeAt(((b & 15) << 2) | (c >> 6)) : 61, i + 2 < end ? ALPHABET.charCodeAt(c & 63) : 61);
    }
    parts.push(String.fromCharCode(...codes));
  }
  return parts.join('');
}

/** Decoded length of a base64 text, or -1 when it is not base64. */
export function base64Length(s: string): number {
  if (s.length % 4 !== 0) return -1;
  let pad = 0;
  if (s.endsWith('==')) pad = 2;
  else if (s.endsWith('=')) pad = 1;
  return (s.length / 4) * 3 - pad;
}

/** Decodes base64; returns null when a character is not in the alphabet or the length is wrong. */
export function decodeBase64(s: string): Uint8Array | null {
  const n = base64Length(s);
  if (n < 0) return null;
  const out = new Uint8Array(n);
  let o = 0;
  for (let i = 0; i < s.length; i += 4) {
    const a = LOOKUP[s.charCodeAt(i) & 127];
    const b = LOOKUP[s.charCodeAt(i + 1) & 127];
    const c3 = s.charCodeAt(i + 2);
    const d4 = s.charCodeAt(i + 3);
    const c = c3 === 61 ? 0 : LOOKUP[c3 & 127];
    const d = d4 === 61 ? 0 : LOOKUP[d4 & 127];
    if (a < 0 || b < 0 || c < 0 || d < 0 || s.charCodeAt(i) > 127 || s.charCodeAt(i + 1) > 127 || c3 > 127 || d4 > 127) return null;
    const v = (a << 18) | (b << 12) | (c << 6) | d;
    if (o < n) out[o++] = v >> 16;
    if (o < n) out[o++] = (v >> 8) & 255;
    if (o < n) out[o++] = v & 255;
  }
  return out;
}

/** Prefix of the compact height form: `"base64-f32le:" + base64 of little-endian float32 heights`. */
export const HEIGHTS_PREFIX = 'base64-f32le:';

export function encodeHeights(h: ArrayLike<number>, scale = 1): string {
  const f = new Float32Array(h.length);
  for (let i = 0; i < h.length; i++) f[i] = h[i] * scale;
  const bytes = new Uint8Array(f.buffer);
  if (!littleEndian()) swap4(bytes);
  return HEIGHTS_PREFIX + encodeBase64(bytes);
}

/** Decodes the compact height form to float64, or a message saying what is wrong. */
export function decodeHeights(s: string): Float64Array | string {
  if (!s.startsWith(HEIGHTS_PREFIX)) return `must be a list of heights or a "${HEIGHTS_PREFIX}" text`;
  const bytes = decodeBase64(s.slice(HEIGHTS_PREFIX.length));
  if (!bytes) return 'is not valid base64 after the prefix';
  if (bytes.length % 4 !== 0) return `holds ${bytes.length} bytes, not a whole number of float32 heights`;
  if (!littleEndian()) swap4(bytes);
  const f = new Float32Array(bytes.buffer, 0, bytes.length / 4);
  return Float64Array.from(f);
}

/** Number of heights a compact text holds (without decoding it), or -1. */
export function compactHeightCount(s: string): number {
  if (!s.startsWith(HEIGHTS_PREFIX)) return -1;
  const n = base64Length(s.slice(HEIGHTS_PREFIX.length));
  return n < 0 || n % 4 !== 0 ? -1 : n / 4;
}

/** One bit per node (least significant bit first), base64. */
export function encodeMask(mask: ArrayLike<number>): string {
  const bytes = new Uint8Array(Math.ceil(mask.length / 8));
  for (let i = 0; i < mask.length; i++) if (mask[i]) bytes[i >> 3] |= 1 << (i & 7);
  return encodeBase64(bytes);
}

export function decodeMask(s: string, n: number): Uint8Array | null {
  const bytes = decodeBase64(s);
  if (!bytes || bytes.length !== Math.ceil(n / 8)) return null;
  const out = new Uint8Array(n);
  for (let i = 0; i < n; i++) out[i] = (bytes[i >> 3] >> (i & 7)) & 1;
  return out;
}

function littleEndian(): boolean {
  return new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
}

function swap4(b: Uint8Array): void {
  for (let i = 0; i + 3 < b.length; i += 4) {
    let t = b[i];
    b[i] = b[i + 3];
    b[i + 3] = t;
    t = b[i + 1];
    b[i + 1] = b[i + 2];
    b[i + 2] = t;
  }
}
