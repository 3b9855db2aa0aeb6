/**
 * Editing the scenario's `builds` list (add, change, remove, reorder), pure and without React, so
 * the form and the store tests share it. Every function returns a new scenario; nothing is
 * validated here: the form checks each candidate with parseScenario(scenarioToFile(...)) and
 * hands valid ones to the store's editScenario / replaceScenario (one undo step each).
 */
import { MAX_BUILDS, parseScenario, scenarioToFile, type BuildSpec, type Scenario, type ScenarioError, type UnitSystem } from '../core';
import type { Key } from './edit';

/** Builds the form lets one add: the compare table shows the vehicle as given plus these (MAX_BUILDS columns). */
export const MAX_FORM_BUILDS = MAX_BUILDS - 1;

const buildsOf = (s: Scenario): readonly BuildSpec[] => s.builds ?? [];

/** A name not yet used by any build of the list ("build 1", "build 2" …). */
export function freshBuildName(builds: readonly BuildSpec[]): string {
  const used = new Set(builds.map((b) => b.name));
  for (let n = builds.length + 1; ; n++) if (!used.has(`build ${n}`)) return `build ${n}`;
}

/** Adds a build at the end (by default one with no modification yet: it compares as the vehicle as given). */
export function addBuild(s: Scenario, build?: BuildSpec): Scenario {
  const list = buildsOf(s);
  return { ...s, builds: [...list, build ?? { name: freshBuildName(list) }] };
}

export function removeBuild(s: Scenario, index: number): Scenario {
  return { ...s, builds: buildsOf(s).filter((_, i) => i !== index) };
}

/** Moves build `index` by `by` places (−1 up, +1 down); out of range: the scenario as it was. */
export function moveBuild(s: Scenario, index: number, by: number): Scenario {
  const list = buildsOf(s).slice();
  const to = index + by;
  if (index < 0 || index >= list.length || to < 0 || to >= list.length) return s;
  const [b] = list.splice(index, 1);
  list.splice(to, 0, b);
  return { ...s, builds: list };
}

export function replaceBuild(s: Scenario, index: number, build: BuildSpec): Scenario {
  return { ...s, builds: buildsOf(s).map((b, i) => (i === index ? build : b)) };
}

const isPlainEmpty = (o: unknown): boolean => o !== null && typeof o === 'object' && !Array.isArray(o) && Object.keys(o).length === 0;

/**
 * Sets (or, with undefined, removes) one value inside a build by key path, copying along the
 * path only; objects left empty by a removal are removed too (a build holds only what changes).
 */
export function setBuildValue(b: BuildSpec, path: readonly Key[], value: unknown): BuildSpec {
  const put = (obj: unknown, p: readonly Key[]): unknown => {
    const [k, ...rest] = p;
    if (Array.isArray(obj)) {
      const copy = obj.slice();
      copy[k as number] = rest.length === 0 ? value : put(obj[k as number], rest);
      return copy;
    }
    const src = (obj ?? {}) as Record<Key, unknown>;
    const next = rest.length === 0 ? value : put(src[k], rest);
    const out: Record<Key, unknown> = { ...src };
    if (next === undefined || isPlainEmpty(next)) delete out[k];
    else out[k] = next;
    return out;
  };
  return put(b, path) as BuildSpec;
}

/** File path of a build's value as validation messages name it (e.g. builds[0].lift.suspension). */
export function buildFilePath(index: number, rest: string): string {
  return rest ? `builds[${index}].${rest}` : `builds[${index}]`;
}

/**
 * Validates a candidate as the other forms do (the file form, parsed). The verdict comes from
 * the metric file form (as edit.ts's validate); the messages, when refused, are taken from the
 * file form in the units shown, so a limit reads "≤ 19.7 in" to someone working in inches.
 */
export function validateBuilds(candidate: Scenario, units: UnitSystem): { ok: true } | { ok: false; errors: ScenarioError[] } {
  const metric = parseScenario(scenarioToFile(candidate, 'metric'));
  if (metric.ok) return { ok: true };
  if (units === 'metric') return { ok: false, errors: metric.errors };
  const shown = parseScenario(scenarioToFile(candidate, units));
  return { ok: false, errors: shown.ok ? metric.errors : shown.errors };
}
