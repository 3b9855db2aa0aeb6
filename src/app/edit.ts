/**
 * Editing the SI scenario field by field. A candidate is checked on its SI form against the
 * scenario's field table and cross-field rules (checkScenarioSI: the same rules and messages as an
 * imported file, at a cost that does not grow with the terrain); when valid, the candidate itself
 * is kept, so fields that were not touched are never converted or rounded.
 */
import { checkScenarioSI, snapToFileUnit, type QuantityKind, type Scenario, type ScenarioError, type UnitSystem } from '../core';

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

/**
 * Validate a candidate; errors by file path, with values and bounds in `units`.
 * @default units metric
 */
export function validate(candidate: Scenario, units: UnitSystem = 'metric'): { ok: true } | { ok: false; errors: ScenarioError[] } {
  const errors = checkScenarioSI(candidate, units);
  return errors.length === 0 ? { ok: true } : { ok: false, errors };
}

/**
 * The candidate scenario after one field is set to `valueSI`, typed in `typedUnits`. A value typed
 * in the file's own unit system is kept exactly (the file writes it back as typed); one typed in
 * the other system is snapped to the file unit's resolution (0.01 in, 0.1 lb, 0.1 mm, ...), so the
 * scenario holds exactly the number the saved file will show and reopening it gives the same result.
 */
export function withField(cur: Scenario, spec: FieldSpec, valueSI: number, typedUnits: UnitSystem): Scenario {
  const v = typedUnits === cur.units ? valueSI : snapToFileUnit(spec.kind, valueSI, cur.units);
  return setIn<Scenario>(cur, spec.si, v);
}

/** The message for one field among a list of errors (exact path, or a path under it). */
export function errorFor(errors: readonly ScenarioError[], file: string): string | null {
  const e = errors.find((x) => x.path === file || x.path.startsWith(file + '.') || x.path.startsWith(file + '['));
  return e ? e.message : null;
}
