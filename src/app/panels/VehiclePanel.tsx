import { AXLE_FIELDS, BODY_FIELDS, PAYLOAD_FIELDS, TYRE_FIELDS, VEHICLE_FIELDS, type AxleSuspension, type NumberRow, type PayloadItem, type Scenario } from '../../core';
import { setIn, validate, type FieldSpec, type Key } from '../edit';
import { usePlumb, usePlumbStore } from '../../store/react';
import { SpecField } from './SpecField';
import { TyreSizeField } from './TyreSizeField';

/**
 * The forms come from the scenario's field table (core/scenario/fields.ts): one SpecField per row,
 * with the row's words, its SI path under `vehicle` and the file path its messages name.
 */
const fromRows = (rows: readonly NumberRow[], si: readonly Key[], file: string, prefix = ''): FieldSpec[] =>
  rows.map((row) => ({
    label: prefix ? `${prefix} ${row.label}` : row.label,
    si: ['vehicle', ...si, ...row.si.split('.')],
    file: `vehicle.${file ? `${file}.` : ''}${row.file}`,
    kind: row.kind,
  }));

const CHASSIS: readonly FieldSpec[] = fromRows(VEHICLE_FIELDS, [], '');
const tyre = (end: 'Front' | 'Rear'): FieldSpec[] =>
  fromRows(TYRE_FIELDS, [end === 'Front' ? 'tyreFront' : 'tyreRear'], end === 'Front' ? 'tyre' : 'tyreRear', end);
// Spring spacing is a solid axle's own field (a cross-field rule refuses it on an independent one).
const axle = (end: 'front' | 'rear'): FieldSpec[] =>
  fromRows(AXLE_FIELDS.filter((r) => r.si !== 'springSpacingM'), [end === 'front' ? 'suspensionFront' : 'suspensionRear'], `suspension.${end}`);
const BODY: readonly FieldSpec[] = fromRows(BODY_FIELDS, ['body'], 'body');
const payloadFields = (i: number): FieldSpec[] => fromRows(PAYLOAD_FIELDS, ['payload', i], `payload[${i}]`);

function Group({ title, specs }: { title: string; specs: readonly FieldSpec[] }) {
  return (
    <fieldset className="group">
      <legend>{title}</legend>
      <div className="grid2">
        {specs.map((s) => (
          <SpecField key={s.file} spec={s} />
        ))}
      </div>
    </fieldset>
  );
}

function AxleGroup({ end }: { end: 'front' | 'rear' }) {
  const store = usePlumbStore();
  const si = end === 'front' ? 'suspensionFront' : 'suspensionRear';
  const type = usePlumb((s) => s.scenario.vehicle[si].type);
  return (
    <fieldset className="group">
      <legend>{end === 'front' ? 'Front' : 'Rear'} suspension</legend>
      <label className="field">
        <span className="field-label">Type</span>
        <select
          value={type}
          data-testid={`field-vehicle.suspension.${end}.type`}
          onChange={(e) => {
            const cur = store.getState().scenario;
            const next = setIn<Scenario>(cur, ['vehicle', si, 'type'], e.target.value as AxleSuspension['type']);
            if (validate(next).ok) store.getState().replaceScenario(next);
          }}
        >
          <option value="solid">solid axle</option>
          <option value="independent">independent</option>
        </select>
      </label>
      <div className="grid2">
        {axle(end).map((s) => (
          <SpecField key={s.file} spec={s} />
        ))}
      </div>
    </fieldset>
  );
}

function PayloadList() {
  const store = usePlumbStore();
  const payload = usePlumb((s) => s.scenario.vehicle.payload);
  const edit = (next: readonly PayloadItem[]) => {
    const cur = store.getState().scenario;
    const cand = setIn<Scenario>(cur, ['vehicle', 'payload'], next);
    if (validate(cand).ok) store.getState().replaceScenario(cand);
  };
  return (
    <fieldset className="group">
      <legend>Payload (rides on the body)</legend>
      {payload.map((p, i) => (
        <div key={i} className="payload-item">
          <div className="row">
            <label className="field">
              <span className="field-label">Item</span>
              <input
                type="text"
                value={p.label}
                onChange={(e) => edit(payload.map((q, j) => (j === i ? { ...q, label: e.target.value } : q)))}
              />
            </label>
            <button type="button" onClick={() => edit(payload.filter((_, j) => j !== i))} aria-label={`Remove ${p.label}`}>
              Remove
            </button>
          </div>
          <div className="grid2">
            {payloadFields(i).map((s) => (
              <SpecField key={s.file} spec={s} />
            ))}
          </div>
        </div>
      ))}
      <button
        type="button"
        data-testid="payload-add"
        onClick={() => {
          const v = store.getState().scenario.vehicle;
          edit([...payload, { label: 'roof load', massKg: 60, behindFrontAxleM: v.wheelbaseM / 2, heightM: v.body.roofHeightM + 0.15, leftOfCentreM: 0 }]);
        }}
      >
        Add payload item
      </button>
    </fieldset>
  );
}

/** Every field of the build, with units, and the rule's message at a field when a value is refused. */
export function VehiclePanel() {
  const store = usePlumbStore();
  const name = usePlumb((s) => s.scenario.vehicle.name);
  return (
    <section className="panel" aria-labelledby="vehicle-h">
      <details>
        <summary>
          <h2 id="vehicle-h">Vehicle build</h2>
        </summary>
        <label className="field">
          <span className="field-label">Name</span>
          <input
            type="text"
            value={name}
            onChange={(e) => {
              const cand = setIn<Scenario>(store.getState().scenario, ['vehicle', 'name'], e.target.value);
              if (validate(cand).ok) store.getState().editScenario(cand, 'vehicle.name');
            }}
          />
        </label>
        <Group title="Chassis, mass and CG" specs={CHASSIS} />
        <TyreSizeField />
        <Group title="Front tyres" specs={tyre('Front')} />
        <Group title="Rear tyres" specs={tyre('Rear')} />
        <AxleGroup end="front" />
        <AxleGroup end="rear" />
        <Group title="Body outline" specs={BODY} />
        <PayloadList />
      </details>
    </section>
  );
}
