import type { AxleSuspension, PayloadItem, Scenario } from '../../core';
import { setIn, validate, type FieldSpec } from '../edit';
import { usePlumb, usePlumbStore } from '../storeContext';
import { SpecField } from './SpecField';
import { TyreSizeField } from './TyreSizeField';

const f = (label: string, si: (string | number)[], file: string, kind: FieldSpec['kind']): FieldSpec => ({ label, si: ['vehicle', ...si], file: `vehicle.${file}`, kind });

const CHASSIS: readonly FieldSpec[] = [
  f('Wheelbase', ['wheelbaseM'], 'wheelbase', 'length'),
  f('Track, front', ['trackFrontM'], 'track.front', 'length'),
  f('Track, rear', ['trackRearM'], 'track.rear', 'length'),
  f('Mass as weighed', ['massKg'], 'mass', 'mass'),
  f('CG behind front axle', ['cg', 'behindFrontAxleM'], 'cg.behindFrontAxle', 'length'),
  f('CG height', ['cg', 'heightM'], 'cg.height', 'length'),
  f('CG left of centre', ['cg', 'leftOfCentreM'], 'cg.leftOfCentre', 'length'),
  f('Unsprung mass, front axle', ['unsprungMassFrontKg'], 'unsprungMass.front', 'mass'),
  f('Unsprung mass, rear axle', ['unsprungMassRearKg'], 'unsprungMass.rear', 'mass'),
];

const tyre = (end: 'Front' | 'Rear'): FieldSpec[] => {
  const si = end === 'Front' ? 'tyreFront' : 'tyreRear';
  const file = end === 'Front' ? 'tyre' : 'tyreRear';
  return [
    f(`${end} tyre radius`, [si, 'radiusM'], `${file}.radius`, 'length'),
    f(`${end} tyre width`, [si, 'widthM'], `${file}.width`, 'length'),
    f(`${end} tyre stiffness`, [si, 'stiffnessNPerM'], `${file}.stiffness`, 'stiffness'),
  ];
};

const axle = (end: 'front' | 'rear'): FieldSpec[] => {
  const si = end === 'front' ? 'suspensionFront' : 'suspensionRear';
  const p = `suspension.${end}`;
  return [
    f('Wheel rate', [si, 'wheelRateNPerM'], `${p}.wheelRate`, 'stiffness'),
    f('Bump travel', [si, 'bumpM'], `${p}.bump`, 'length'),
    f('Droop travel', [si, 'droopM'], `${p}.droop`, 'length'),
    f('Anti-roll bar', [si, 'antiRollNmPerRad'], `${p}.antiRoll`, 'rollStiffness'),
    f('Roll-centre height', [si, 'rollCentreHeightM'], `${p}.rollCentreHeight`, 'length'),
  ];
};

const BODY: readonly FieldSpec[] = [
  f('Front overhang', ['body', 'frontOverhangM'], 'body.frontOverhang', 'length'),
  f('Rear overhang', ['body', 'rearOverhangM'], 'body.rearOverhang', 'length'),
  f('Body width', ['body', 'widthM'], 'body.width', 'length'),
  f('Belly clearance', ['body', 'bellyClearanceM'], 'body.bellyClearance', 'length'),
  f('Front bumper clearance', ['body', 'frontBumperClearanceM'], 'body.frontBumperClearance', 'length'),
  f('Rear bumper clearance', ['body', 'rearBumperClearanceM'], 'body.rearBumperClearance', 'length'),
  f('Roof height', ['body', 'roofHeightM'], 'body.roofHeight', 'length'),
];

const payloadFields = (i: number): FieldSpec[] => [
  f('Mass', ['payload', i, 'massKg'], `payload[${i}].mass`, 'mass'),
  f('Behind front axle', ['payload', i, 'behindFrontAxleM'], `payload[${i}].behindFrontAxle`, 'length'),
  f('Height', ['payload', i, 'heightM'], `payload[${i}].height`, 'length'),
  f('Left of centre', ['payload', i, 'leftOfCentreM'], `payload[${i}].leftOfCentre`, 'length'),
];

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
