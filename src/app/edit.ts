/**
 * Editing the SI scenario field by field. A candidate is validated by writing it to the file
 * form and parsing it (the same rules as an imported file); when valid, the candidate itself is
 * kept, so fields that were not touched are never converted or rounded.
 */
import { parseScenario, scenarioToFile, type QuantityKind, type Scenario, type ScenarioError } from '../core';

export type Key = string | number;

/** Immutable set at a path of keys (objects and arrays are copied along the path only). */
export function setIn<T>(obj: T, path: readonly Key[], value: unknown): T {
  if (path.length === 0) return value as T;
  const [k, ...rest] = path;
  const cur = (obj as Record<Key, unknown>)[k];
  const next = setIn(cur, rest, value);
  if (Array.isArray(obj)) {
    const copy = obj.slice();
    copy[k as number] = next;
    return copy as T;
  }
  return { ...(obj as object), [k]: next } as T;
}

export function getIn(obj: unknown, path: readonly Key[]): unknown {
  let o = obj;
  for (const k of path) o = (o as Record<Key, unknown>)?.[k];
  return o;
}

export interface FieldSpec {
  readonly label: string;
  /** Path in the SI scenario. */
  readonly si: readonly Key[];
  /** Path in the file form, as validation messages name it (e.g. vehicle.track.front). */
  readonly file: string;
  readonly kind: QuantityKind;
}

/** Validate a candidate; errors by file path. */
export function validate(candidate: Scenario): { ok: true } | { ok: false; errors: ScenarioError[] } {
  const parsed = parseScenario(scenarioToFile(candidate, 'metric'));
  return parsed.ok ? { ok: true } : { ok: false, errors: parsed.errors };
}

/** The message for one field among a list of errors (exact path, or a path under it). */
export function errorFor(errors: readonly ScenarioError[], file: string): string | null {
  const e = errors.find((x) => x.path === file || x.path.startsWith(file + '.') || x.path.startsWith(file + '['));
  return e ? e.message : null;
}
