import type { Scenario, TerrainFeature } from '../../core';
import { setIn, validate, type FieldSpec } from '../edit';
import { PRESETS, presetFeatures } from '../presets';
import { usePlumb, usePlumbStore } from '../storeContext';
import { SpecField } from './SpecField';

type K = FieldSpec['kind'];

/** Numeric fields of one feature: [label, key in the SI feature (or [key, index]), file key, kind]. */
const FIELDS: Record<TerrainFeature['type'], readonly [string, (string | number)[], string, K][]> = {
  plane: [
    ['Grade (rises to +x)', ['gradeRad'], 'grade', 'angle'],
    ['Cross slope (rises to +y)', ['crossSlopeRad'], 'crossSlope', 'angle'],
    ['Height at origin', ['heightM'], 'height', 'length'],
  ],
  step: [
    ['Edge at x', ['xM'], 'x', 'length'],
    ['Height (− drops)', ['heightM'], 'height', 'length'],
    ['Edge radius', ['edgeRadiusM'], 'edgeRadius', 'length'],
  ],
  block: [
    ['x from', ['xRangeM', 0], 'x', 'length'],
    ['x to', ['xRangeM', 1], 'x', 'length'],
    ['y from', ['yRangeM', 0], 'y', 'length'],
    ['y to', ['yRangeM', 1], 'y', 'length'],
    ['Height (− pit)', ['heightM'], 'height', 'length'],
    ['Edge radius', ['edgeRadiusM'], 'edgeRadius', 'length'],
  ],
  rock: [
    ['Centre x', ['xM'], 'x', 'length'],
    ['Centre y', ['yM'], 'y', 'length'],
    ['Height', ['heightM'], 'height', 'length'],
    ['Footprint radius', ['radiusM'], 'radius', 'length'],
  ],
  ramp: [
    ['Starts at x', ['xM'], 'x', 'length'],
    ['Angle', ['angleRad'], 'angle', 'angle'],
    ['Length along surface', ['lengthM'], 'length', 'length'],
  ],
  profile: [],
  grid: [['Node spacing', ['spacingM'], 'spacing', 'length']],
};

const NAMES: Record<TerrainFeature['type'], string> = {
  plane: 'Slope (plane)',
  step: 'Ledge (step)',
  block: 'Block or pit',
  rock: 'Rock (dome)',
  ramp: 'Ramp',
  profile: 'Height profile',
  grid: 'Height grid',
};

/** Terrain features: add from presets, edit, reorder and remove. */
export function TerrainPanel() {
  const store = usePlumbStore();
  const features = usePlumb((s) => s.scenario.terrain.features);
  const commit = (next: readonly TerrainFeature[]) => {
    const cand: Scenario = { ...store.getState().scenario, terrain: { features: next } };
    if (validate(cand).ok) store.getState().replaceScenario(cand);
  };
  return (
    <section className="panel" aria-labelledby="terrain-h">
      <details>
        <summary>
          <h2 id="terrain-h">Terrain ({features.length} feature{features.length === 1 ? '' : 's'})</h2>
        </summary>
        <p className="hint">Heights of all features add up. Add an obstacle where the vehicle stands now:</p>
        <div className="buttons">
          {PRESETS.map((p) => (
            <button key={p.name} type="button" data-testid={`preset-${p.name}`} onClick={() => commit([...features, ...presetFeatures(p.name, store.getState().scenario)])}>
              {p.label}
            </button>
          ))}
          <button type="button" onClick={() => commit([])} disabled={features.length === 0}>
            Level ground only
          </button>
        </div>
        <ol className="features">
          {features.map((feat, i) => (
            <li key={i} data-testid={`feature-${i}`}>
              <div className="row feature-head">
                <strong>{NAMES[feat.type]}</strong>
                <span className="spacer" />
                <button type="button" disabled={i === 0} aria-label="Move up" onClick={() => commit(swap(features, i, i - 1))}>
                  ↑
                </button>
                <button type="button" disabled={i === features.length - 1} aria-label="Move down" onClick={() => commit(swap(features, i, i + 1))}>
                  ↓
                </button>
                <button type="button" onClick={() => commit(features.filter((_, j) => j !== i))}>
                  Remove
                </button>
              </div>
              <div className="grid2">
                {FIELDS[feat.type]
                  .filter(([, key]) => !(key.length === 2 && (feat as unknown as Record<string, unknown>)[key[0] as string] == null))
                  .map(([label, key, file, kind]) => (
                    <SpecField
                      key={`${i}-${key.join('.')}`}
                      spec={{ label, si: ['terrain', 'features', i, ...key], file: `terrain.features[${i}].${file}`, kind }}
                    />
                  ))}
              </div>
              {feat.type === 'profile' ? <p className="hint">{feat.points.length} points along {feat.axis}.</p> : null}
              {feat.type === 'grid' ? <p className="hint">{feat.cols} × {feat.rows} nodes.</p> : null}
            </li>
          ))}
        </ol>
      </details>
    </section>
  );
}

function swap<T>(a: readonly T[], i: number, j: number): T[] {
  const c = a.slice();
  [c[i], c[j]] = [c[j], c[i]];
  return c;
}
