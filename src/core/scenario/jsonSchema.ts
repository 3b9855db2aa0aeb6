/**
 * The scenario file format as a JSON Schema (draft 2020-12), generated from the same zod schema
 * that `parseScenario` validates with (`scenarioFileSchema`), so the two cannot drift apart.
 * `npm run schema` writes it to `assets/scenario.schema.json`; a test regenerates it and compares.
 *
 * One schema per unit system (the bounds are in the file's units), joined on the `units` key the
 * way the parser reads it: `"imperial"` selects the imperial variant, anything else the metric one
 * (which then accepts only `"metric"`).
 *
 * What JSON Schema cannot say, and so only the parser checks (see docs/scenario-format.md):
 * checks across fields (CG within the wheelbase, unsprung below total mass, grid size against its
 * heights, the path's station count), whole-number grid sizes, from < to in ranges, profile
 * points in increasing order. Three fields are checked by hand in the zod schema (a transform, which
 * zod cannot export): `tilt.downhill`, grid `heights` and a build's `antiRoll`; their JSON form is given here beside the
 * rule they mirror.
 */
import * as z from 'zod';
import type { UnitSystem } from './types';
import { DOWNHILL_NAMES, PLAUSIBLE, SCENARIO_LIMITS, SCENARIO_VERSION, UNIT_SYSTEMS, scenarioFileSchema } from './schema';
import { metricToFileUnits, unitLabel } from './units';

/** Address of the shipped schema, relative to a file in assets/scenarios/. */
export const SCENARIO_SCHEMA_REF = '../scenario.schema.json';

type Json = Record<string, unknown>;

/** JSON form of the hand-checked fields (schema.ts `downhill`, `gridHeights`, `antiRollSetting`), by their path in the JSON Schema. */
function handChecked(path: readonly (string | number)[], u: UnitSystem): Json | undefined {
  const key = path[path.length - 1];
  const parent = path[path.length - 3];
  if (parent === 'antiRoll' && (key === 'front' || key === 'rear')) {
    // schema.ts builds: "disconnected" or a stiffness ≥ 0 in the file's roll-stiffness unit.
    return {
      description: `Anti-roll bar: "disconnected" or a stiffness in ${unitLabel('rollStiffness', u)}.`,
      anyOf: [{ type: 'number', minimum: 0 }, { type: 'string', const: 'disconnected' }],
    };
  }
  if (key === 'downhill') {
    // schema.ts: a named direction, or a finite angle in degrees within ±360.
    return {
      description: 'Downhill direction in the vehicle frame: degrees counter-clockwise from the nose (0 nose down, 90 left side down, 180 tail down, 270 right side down) or a name.',
      anyOf: [
        { type: 'number', minimum: -360, maximum: 360 },
        { type: 'string', enum: Object.keys(DOWNHILL_NAMES) },
      ],
    };
  }
  if (key === 'heights') {
    // schema.ts: a list of at most gridNodes finite heights within ±heightMaxM (file units).
    const maxH = metricToFileUnits('length', PLAUSIBLE.heightMaxM, u);
    return {
      description: `Node heights, row-major (index = row × cols + col), in ${unitLabel('length', u)}; or, for imported ground, "base64-f32le:" and the heights as little-endian float32 in base64.`,
      anyOf: [
        { type: 'array', maxItems: SCENARIO_LIMITS.gridNodes, items: { type: 'number', minimum: -maxH, maximum: maxH } },
        { type: 'string', pattern: '^base64-f32le:[A-Za-z0-9+/]*={0,2}$' },
      ],
    };
  }
  if (key === 'filled') {
    // schema.ts gridFilled: base64, one bit per node, 1 = filled in by the import.
    return { description: 'Imported ground: nodes whose height was filled in, one bit per node (least significant first), base64.', type: 'string', pattern: '^[A-Za-z0-9+/]*={0,2}$' };
  }
  return undefined;
}

/** The parts of zod's schema internals read here (zod 4: `_zod.def`). */
interface ZodInternals {
  readonly _zod: {
    readonly def: {
      readonly type: string;
      readonly in?: ZodInternals;
      readonly checks?: readonly { readonly _zod: { readonly def: { readonly check: string; readonly minimum?: number; readonly maximum?: number } } }[];
    };
  };
}

/** The JSON Schema of one unit system's variant (no `$schema` key). */
export function scenarioJsonSchemaFor(u: UnitSystem): Json {
  const out = z.toJSONSchema(scenarioFileSchema(u), {
    target: 'draft-2020-12',
    // The output side: a pipe `array(unknown) → array(element)` (the size limit is checked first,
    // then the elements) shows its elements; the size limit is copied back from the input side.
    io: 'output',
    unrepresentable: (ctx) => handChecked(ctx.path, u) ?? 'throw',
    override: (ctx) => {
      const def = (ctx.zodSchema as unknown as ZodInternals)._zod.def;
      if (def.type !== 'pipe' || !def.in || def.in._zod.def.type !== 'array') return;
      const js = ctx.jsonSchema as Json;
      for (const c of def.in._zod.def.checks ?? []) {
        const cd = c._zod.def;
        if (cd.check === 'min_length' && typeof cd.minimum === 'number' && cd.minimum > 0) js.minItems = cd.minimum;
        if (cd.check === 'max_length' && typeof cd.maximum === 'number') js.maxItems = cd.maximum;
      }
    },
  }) as Json;
  delete out.$schema;
  const props = out.properties as Record<string, Json>;
  // One variant per unit system: its own `units` value only.
  props.units = { type: 'string', const: u, description: 'Unit system of every number in the file (angles are always degrees).' };
  props.$schema = { type: 'string', description: 'Address of this JSON Schema, for editors.' };
  props.version = { ...props.version, description: `File format version; ${SCENARIO_VERSION} is current.` };
  return out;
}

/**
 * The whole scenario JSON Schema: both unit systems, chosen by `units` as the parser does.
 * Deterministic (same input, same text), so the committed file can be checked for drift.
 */
export function scenarioJsonSchema(): Json {
  const [metric, imperial] = UNIT_SYSTEMS;
  return {
    $schema: 'https://json-schema.org/draft/2020-12/schema',
    title: 'Plumbline scenario file',
    description:
      `Plumbline scenario, format version ${SCENARIO_VERSION}. Lengths in m (metric) or in (imperial), masses in kg or lb, ` +
      'stiffness in N/m or lbf/in, anti-roll in N·m/deg or lbf·ft/deg, angles in degrees. ' +
      'Generated from the zod schema the app validates with (npm run schema); do not edit by hand. ' +
      'The app also checks what JSON Schema cannot (CG within the wheelbase, grid size, ...): see docs/scenario-format.md.',
    type: 'object',
    required: ['units'],
    properties: { units: { type: 'string', enum: [...UNIT_SYSTEMS] } },
    if: { properties: { units: { const: imperial } }, required: ['units'] },
    then: { $ref: `#/$defs/${imperial}` },
    else: { $ref: `#/$defs/${metric}` },
    $defs: { [metric]: scenarioJsonSchemaFor(metric), [imperial]: scenarioJsonSchemaFor(imperial) },
  };
}

/** The schema file's text: 2-space JSON and a final newline. */
export function scenarioJsonSchemaText(): string {
  return `${JSON.stringify(scenarioJsonSchema(), null, 2)}\n`;
}
