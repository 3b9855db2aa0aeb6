/**
 * Scenario file versions. `migrateScenario(obj)` brings a parsed scenario file (plain JSON data,
 * before validation) up to the current format version, one step at a time, and says what it did.
 *
 * - Version 1 is current (SCENARIO_VERSION).
 * - A file with no `version` key is read as version 1, with a warning (files written before the
 *   key was required).
 * - A version newer than this build knows is refused with a clear message: reading it as an older
 *   version would silently drop or misread keys.
 *
 * To add version 2: raise SCENARIO_VERSION in schema.ts, add one entry to `STEPS` (`1: v1ToV2`)
 * that rewrites a version-1 object into a version-2 object (pure, no validation; the schema then
 * checks the result), and describe the change in docs/scenario-format.md.
 */
import { SCENARIO_VERSION } from './schema';
import type { ScenarioError } from './types';

/** One step: a file object of version N → the same scenario as version N + 1. Pure: returns a new object. */
export type MigrationStep = (file: Readonly<Record<string, unknown>>) => Record<string, unknown>;

/**
 * Steps by the version they start from. Empty while version 1 is the only version; a v1 → v2 step
 * goes in as `1: (f) => ({ ...f, version: 2, ... })`.
 */
export const MIGRATION_STEPS: Readonly<Record<number, MigrationStep>> = {};

export type MigrateResult =
  | {
      readonly ok: true;
      /** The file object at the current version (the input itself when nothing changed). */
      readonly file: unknown;
      /** The version the file said it was (1 when it gave none). */
      readonly fromVersion: number;
      readonly warnings: string[];
    }
  | { readonly ok: false; readonly errors: ScenarioError[] };

function isPlainObject(v: unknown): v is Record<string, unknown> {
  if (v === null || typeof v !== 'object' || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v);
  return proto === Object.prototype || proto === null;
}

/**
 * Bring a scenario file object up to the current version. Never throws. Anything that is not an
 * object, or a `version` that is not a whole number, is passed through unchanged for the schema to
 * report (it names the field and the expected value); only a version from the future, or one with
 * no migration path, is refused here.
 *
 * @param steps the migration steps (tests pass their own). @default MIGRATION_STEPS
 * @param currentVersion @default SCENARIO_VERSION
 */
export function migrateScenario(
  input: unknown,
  steps: Readonly<Record<number, MigrationStep>> = MIGRATION_STEPS,
  currentVersion: number = SCENARIO_VERSION,
): MigrateResult {
  if (!isPlainObject(input)) return { ok: true, file: input, fromVersion: currentVersion, warnings: [] };
  const warnings: string[] = [];
  const has = Object.prototype.hasOwnProperty.call(input, 'version');
  const raw = has ? input.version : undefined;
  let file: Record<string, unknown> = input;
  let version: number;
  if (raw === undefined) {
    version = 1;
    warnings.push(`version: not given; reading the file as version 1 (add "version": 1${currentVersion !== 1 ? `, or let the app rewrite it as version ${currentVersion}` : ''})`);
    // Define, not assign: the input stays untouched.
    file = { ...input };
    Object.defineProperty(file, 'version', { value: 1, enumerable: true, writable: true, configurable: true });
  } else if (typeof raw !== 'number' || !Number.isInteger(raw) || raw < 1) {
    // Not a version at all: the schema reports it ("must be 1, got ...").
    return { ok: true, file: input, fromVersion: currentVersion, warnings };
  } else {
    version = raw;
  }
  if (version > currentVersion) {
    return {
      ok: false,
      errors: [
        {
          path: 'version',
          message: `this file is format version ${version}, newer than this version of Plumbline reads (${currentVersion}); update Plumbline to open it`,
        },
      ],
    };
  }
  const fromVersion = version;
  while (version < currentVersion) {
    const step = steps[version];
    if (!step) {
      return {
        ok: false,
        errors: [{ path: 'version', message: `no migration from format version ${version} to ${version + 1}; this file cannot be read` }],
      };
    }
    file = step(file);
    version++;
    if (file.version !== version) {
      return {
        ok: false,
        errors: [{ path: 'version', message: `internal error: the step from version ${version - 1} gave version ${String(file.version)}` }],
      };
    }
  }
  if (fromVersion < currentVersion) warnings.push(`version: read as format version ${fromVersion} and brought up to version ${currentVersion}`);
  return { ok: true, file, fromVersion, warnings };
}
