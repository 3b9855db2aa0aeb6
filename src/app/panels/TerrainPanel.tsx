import type { Scenario, TerrainFeature } from '../../core';
import { validate, type FieldSpec } from '../edit';
import { PRESETS, presetFeatures } from '../presets';
import { usePlumb, usePlumbStore } from '../../store/react';
import { SpecField } from './SpecField';
import { TerrainCsvImport } from './TerrainCsvImport';
import { GroundImport } from './GroundImport';

/** Profile points listed for editing; a longer profile (an import) is edited as a file. */
const MAX_EDITED_POINTS = 40;

/** The lateral-range key of the features that may be bounded across, or null. */
function boundKey(f: TerrainFeature): 'yRangeM' | 'acrossM' | null {
  return f.type === 'step' || f.type === 'ramp' ? 'yRangeM' : f.type === 'profile' ? 'acrossM' : null;
}

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
    ['y from', ['yRangeM', 0], 'y', 'length'],
    ['y to', ['yRangeM', 1], 'y', 'length'],
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
    ['y from', ['yRangeM', 0], 'y', 'length'],
    ['y to', ['yRangeM', 1], 'y', 'length'],
  ],
  profile: [
    ['Across from', ['acrossM', 0], 'across', 'length'],
    ['Across to', ['acrossM', 1], 'across', 'length'],
  ],
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
          <button
            type="button"
            data-testid="add-profile"
            onClick={() => {
              const x = store.getState().scenario.pose.xM;
              // A low hump ahead of the vehicle, to edit point by point.
              commit([...features, { type: 'profile', axis: 'x', points: [[x + 2, 0], [x + 2.5, 0.15], [x + 3, 0]], acrossM: null }]);
            }}
          >
            Height profile
          </button>
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
              {boundKey(feat) ? (
                <label className="inline">
                  <input
                    type="checkbox"
                    data-testid={`feature-${i}-bounded`}
                    checked={(feat as unknown as Record<string, unknown>)[boundKey(feat)!] != null}
                    onChange={(e) => {
                      const k = boundKey(feat)!;
                      const pose = store.getState().scenario.pose;
                      // Across a profile along y is x; otherwise y. Default: 1.5 m either side of the vehicle.
                      const c = feat.type === 'profile' && feat.axis === 'y' ? pose.xM : pose.yM;
                      commit(features.map((f, j) => (j === i ? ({ ...f, [k]: e.target.checked ? [c - 1.5, c + 1.5] : null } as TerrainFeature) : f)));
                    }}
                  />{' '}
                  Bounded across (unticked: runs on without end to both sides)
                </label>
              ) : null}
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
              {feat.type === 'profile' ? (
                <div className="profile-points">
                  <p className="hint">
                    {feat.points.length} points along {feat.axis} (distance, height); level beyond the ends.
                  </p>
                  {feat.points.length <= MAX_EDITED_POINTS ? (
                    <>
                      {feat.points.map((_, k) => (
                        <div key={k} className="row point-row">
                          {[0, 1].map((c) => (
                            <SpecField
                              key={c}
                              testId={`feature-${i}-point-${k}-${c === 0 ? 's' : 'z'}`}
                              spec={{ label: c === 0 ? `Point ${k + 1}: at` : 'height', si: ['terrain', 'features', i, 'points', k, c], file: `terrain.features[${i}].points[${k}]`, kind: 'length' }}
                            />
                          ))}
                          <button type="button" aria-label={`Remove point ${k + 1}`} disabled={feat.points.length <= 2} onClick={() => commit(features.map((f, j) => (j === i ? { ...feat, points: feat.points.filter((_p, q) => q !== k) } : f)))}>
                            ✕
                          </button>
                        </div>
                      ))}
                      <button
                        type="button"
                        data-testid={`feature-${i}-add-point`}
                        onClick={() => {
                          const last = feat.points[feat.points.length - 1];
                          commit(features.map((f, j) => (j === i ? { ...feat, points: [...feat.points, [last[0] + 1, last[1]] as const] } : f)));
                        }}
                      >
                        Add a point
                      </button>
                    </>
                  ) : (
                    <p className="hint">Too many points to list here ({feat.points.length}); edit them in a file and import it.</p>
                  )}
                </div>
              ) : null}
              {feat.type === 'grid' ? <p className="hint">{feat.cols} × {feat.rows} nodes.</p> : null}
            </li>
          ))}
        </ol>
        <TerrainCsvImport />
        <GroundImport />
      </details>
    </section>
  );
}

function swap<T>(a: readonly T[], i: number, j: number): T[] {
  const c = a.slice();
  [c[i], c[j]] = [c[j], c[i]];
  return c;
}
