/** Reading a scenario file for any command: errors to stderr as `path: message` lines. */
import { fileSizeProblem, parseScenarioBytes, parseScenarioText, type Scenario } from '../core/index';
import type { CliIO } from './command';

export type LoadResult =
  | { readonly ok: true; readonly scenario: Scenario; readonly warnings: readonly string[] }
  | { readonly ok: false; readonly reason: 'unreadable' | 'invalid' };

/**
 * Read and validate a scenario file. On failure prints a header line (`FILE: N errors`) and one
 * `path: message` line per problem to stderr; the caller exits 2.
 */
export function loadScenarioFile(file: string, io: CliIO): LoadResult {
  let r: ReturnType<typeof parseScenarioText>;
  try {
    // The size limit from the file's size, before it is read; then the encoding from its bytes
    // (the same rules as the app's "Open file").
    const size = io.fileSize?.(file);
    const tooBig = size === undefined ? null : fileSizeProblem(size);
    if (tooBig) r = { ok: false, errors: [{ path: '(file)', message: tooBig }] };
    else r = io.readBytes ? parseScenarioBytes(io.readBytes(file)) : parseScenarioText(io.readFile(file));
  } catch (e) {
    const code = (e as { code?: unknown }).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : e instanceof Error ? e.message : String(e);
    io.err(`plumbline: cannot read ${file}: ${why}`);
    return { ok: false, reason: 'unreadable' };
  }
  if (!r.ok) {
    io.err(`${file}: ${r.errors.length} ${r.errors.length === 1 ? 'error' : 'errors'}`);
    for (const e of r.errors) io.err(`${e.path}: ${e.message}`);
    return { ok: false, reason: 'invalid' };
  }
  for (const w of r.warnings) io.err(`${file}: warning: ${w}`);
  return { ok: true, scenario: r.scenario, warnings: r.warnings };
}

/** JSON text of a core value: typed arrays as plain lists. */
export function toJsonText(value: unknown): string {
  return JSON.stringify(
    value,
    (_key, v: unknown) => (ArrayBuffer.isView(v) && !(v instanceof DataView) ? Array.from(v as unknown as ArrayLike<number>) : v),
    2,
  );
}
