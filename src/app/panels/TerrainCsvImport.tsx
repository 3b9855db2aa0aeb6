import { useState } from 'react';
import { fromSI, parseScenario, scenarioToFile, type Scenario, type ScenarioError } from '../../core';
import { csvPlace, gridFromCsv, profileFromCsv, type CsvError } from '../../core/scenario/csv';
import { fieldUnit } from '../../present/fields';
import { usePlumb, usePlumbStore } from '../../store/react';
import { NumberField } from './NumberField';

type Kind = 'profile-x' | 'profile-y' | 'grid';

/**
 * A height profile or grid from a CSV file, in the display length unit. The numbers become a
 * terrain feature in the file form and go through parseScenario, so a broken rule is named by
 * its field; a file that fails leaves the scenario as it was and lists the problems.
 */
export function TerrainCsvImport() {
  const store = usePlumbStore();
  const units = usePlumb((s) => s.units);
  const [kind, setKind] = useState<Kind>('profile-x');
  const pose = usePlumb((s) => s.scenario.pose);
  const [origin, setOrigin] = useState<[number, number]>(() => [pose.xM - 5, pose.yM - 5]);
  const [spacingM, setSpacingM] = useState(0.25);
  const lengthUnit = fieldUnit('length', units);

  const load = (name: string, text: string) => {
    const st = store.getState();
    const fail = (errors: readonly ScenarioError[]) => store.setState({ importErrors: errors, importWarnings: [] });
    const csvFail = (errs: readonly CsvError[]) => fail(errs.map((e) => ({ path: `${name} ${csvPlace(e)}`, message: e.message })));
    const file = scenarioToFile(st.scenario, st.units) as unknown as { terrain: { features: unknown[] } };
    const fileLen = (m: number) => fromSI('length', m, st.units);
    let feature: Record<string, unknown>;
    let what: string;
    if (kind === 'grid') {
      const g = gridFromCsv(text);
      if (!g.ok) return csvFail(g.errors);
      feature = { type: 'grid', origin: [fileLen(origin[0]), fileLen(origin[1])], spacing: fileLen(spacingM), cols: g.cols, rows: g.rows, heights: g.heights };
      what = `a ${g.cols} × ${g.rows} height grid`;
    } else {
      const p = profileFromCsv(text);
      if (!p.ok) return csvFail(p.errors);
      feature = { type: 'profile', axis: kind === 'profile-x' ? 'x' : 'y', points: p.points };
      what = `a height profile of ${p.points.length} points along ${kind === 'profile-x' ? 'x' : 'y'}`;
    }
    file.terrain.features = [...file.terrain.features, feature];
    const parsed = parseScenario(file);
    if (!parsed.ok) return fail(parsed.errors);
    // Only the new feature is taken from the round trip: the rest of the scenario stays exactly as it was.
    const added = parsed.scenario.terrain.features[parsed.scenario.terrain.features.length - 1];
    const next: Scenario = { ...st.scenario, terrain: { features: [...st.scenario.terrain.features, added] } };
    st.replaceScenario(next);
    store.setState({ importErrors: null, importWarnings: [`Added ${what} from ${name}.`] });
  };

  return (
    <fieldset className="group">
      <legend>Heights from a CSV file</legend>
      <div className="row">
        <label className="field">
          <span className="field-label">The file holds</span>
          <select data-testid="terrain-csv-kind" value={kind} onChange={(e) => setKind(e.target.value as Kind)}>
            <option value="profile-x">a profile along x (distance, height)</option>
            <option value="profile-y">a profile along y (distance, height)</option>
            <option value="grid">a grid (one row of heights per row along y)</option>
          </select>
        </label>
      </div>
      {kind === 'grid' ? (
        <div className="row">
          <NumberField label="Grid origin x" kind="length" units={units} valueSI={origin[0]} onChange={(v) => setOrigin([v, origin[1]])} />
          <NumberField label="Grid origin y" kind="length" units={units} valueSI={origin[1]} onChange={(v) => setOrigin([origin[0], v])} />
          <NumberField label="Node spacing" kind="length" units={units} valueSI={spacingM} check={(d) => (d <= 0 ? 'must be > 0' : null)} onChange={setSpacingM} />
        </div>
      ) : null}
      <label className="file-button light">
        Choose a CSV file…
        <input
          type="file"
          accept=".csv,.txt,text/csv,text/plain"
          data-testid="terrain-csv"
          onChange={async (e) => {
            const f = e.target.files?.[0];
            e.target.value = '';
            if (f) load(f.name, await f.text());
          }}
        />
      </label>
      <p className="fineprint">Numbers in {lengthUnit}, decimal point, comma, semicolon or tab between cells; a header row and # comment lines are skipped.</p>
    </fieldset>
  );
}
